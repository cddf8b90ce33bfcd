import { GRAMS_PER_POUND } from '../units/units';

/**
 * Feed money, in integer cents of the co-op's currency (the code knows no currency). Amounts are kept
 * exact until the last step and rounded half up to the cent there.
 */

const roundCents = (value: number) => Math.round(value);

function positiveGrams(value: number, what: string): number {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`${what} must be above zero grams`);
  return value;
}

function cents(value: number, what: string): number {
  if (!Number.isInteger(value) || value < 0) throw new RangeError(`${what} must be a whole number of cents, 0 or more`);
  return value;
}

/** Cents per kilogram of a cost spread over a weight. */
export function centsPerKg(costCents: number, grams: number): number {
  return roundCents((cents(costCents, 'The cost') * 1000) / positiveGrams(grams, 'The weight'));
}

/** Cents per pound (NIST Handbook 44: 1 lb = 453.59237 g). */
export function centsPerLb(costCents: number, grams: number): number {
  return roundCents((cents(costCents, 'The cost') * GRAMS_PER_POUND) / positiveGrams(grams, 'The weight'));
}

export interface FeedPurchase {
  id: string;
  /** The feed (a product or mix); uses draw on purchases of the same feed. */
  feedId: string;
  boughtOn: string;
  /** Grams bought (bag weight × bags). */
  grams: number;
  /** What was paid for them, in cents. */
  priceCents: number;
  crudeProteinPercent?: number | null;
}

export interface FeedUse {
  id: string;
  feedId: string;
  givenOn: string;
  grams: number;
}

/** Grams in a purchase of whole bags. */
export function purchaseGrams(bagGrams: number, bags: number): number {
  if (!Number.isInteger(bagGrams) || bagGrams <= 0) throw new RangeError('A bag must weigh a whole number of grams above zero');
  if (!Number.isInteger(bags) || bags < 1) throw new RangeError('Buy at least one whole bag');
  return bagGrams * bags;
}

export interface FeedUseIssue {
  useId: string;
  code: 'not_positive' | 'before_purchase' | 'more_than_bought';
  message: string;
}

const byDateThenId = <T extends { id: string }>(date: (x: T) => string) => (a: T, b: T) =>
  date(a) < date(b) ? -1 : date(a) > date(b) ? 1 : a.id.localeCompare(b.id);

/**
 * Feed cannot be given before it was bought, nor more of it than was bought by that date. Purchases on
 * the day of a use count for it. One issue per bad use.
 */
export function checkFeedUses(
  purchases: ReadonlyArray<FeedPurchase>,
  uses: ReadonlyArray<FeedUse>,
  /** How the message shows a weight (the farm's units); grams by default. */
  showWeight: (grams: number) => string = (grams) => `${Math.round(grams)} g`,
): FeedUseIssue[] {
  const issues: FeedUseIssue[] = [];
  const feeds = new Set(uses.map((u) => u.feedId));
  for (const feedId of feeds) {
    const bought = purchases.filter((p) => p.feedId === feedId).sort(byDateThenId((p) => p.boughtOn));
    const given = uses.filter((u) => u.feedId === feedId).sort(byDateThenId((u) => u.givenOn));
    let stock = 0;
    let next = 0;
    for (const use of given) {
      if (!Number.isFinite(use.grams) || use.grams <= 0) {
        issues.push({ useId: use.id, code: 'not_positive', message: 'Feed given must be above zero grams' });
        continue;
      }
      while (next < bought.length && bought[next]!.boughtOn <= use.givenOn) stock += bought[next++]!.grams;
      if (next === 0) {
        const first = bought[0];
        issues.push({
          useId: use.id, code: 'before_purchase',
          message: first ? `Feed given on ${use.givenOn}, before it was first bought on ${first.boughtOn}` : `Feed given on ${use.givenOn}, but none of it was ever bought`,
        });
        continue;
      }
      if (use.grams > stock) {
        issues.push({ useId: use.id, code: 'more_than_bought', message: `${showWeight(use.grams)} given on ${use.givenOn}, but only ${showWeight(Math.max(stock, 0))} of that feed was left` });
        continue;
      }
      stock -= use.grams;
    }
  }
  return issues;
}

/**
 * The cost of each use, first bought first used, in whole cents. Rounding is done on the running total,
 * so the cents of all uses add up to the exact cost of the feed they drew, to the cent. Throws when the
 * uses fail checkFeedUses.
 */
export function costFeedUses(purchases: ReadonlyArray<FeedPurchase>, uses: ReadonlyArray<FeedUse>): Map<string, number> {
  const issues = checkFeedUses(purchases, uses);
  if (issues.length > 0) throw new RangeError(issues.map((i) => i.message).join('; '));
  const result = new Map<string, number>();
  const feeds = new Set(uses.map((u) => u.feedId));
  for (const feedId of feeds) {
    const lots = purchases
      .filter((p) => p.feedId === feedId)
      .sort(byDateThenId((p) => p.boughtOn))
      .map((p) => ({ left: p.grams, centsPerGram: cents(p.priceCents, 'A price') / positiveGrams(p.grams, 'A purchase') }));
    let runningExact = 0;
    let runningRounded = 0;
    let lot = 0;
    for (const use of uses.filter((u) => u.feedId === feedId).sort(byDateThenId((u) => u.givenOn))) {
      let need = use.grams;
      while (need > 1e-9) {
        const current = lots[lot]!;
        const take = Math.min(need, current.left);
        runningExact += take * current.centsPerGram;
        current.left -= take;
        need -= take;
        if (current.left <= 1e-9) lot++;
      }
      const rounded = roundCents(runningExact);
      result.set(use.id, rounded - runningRounded);
      runningRounded = rounded;
    }
  }
  return result;
}

/**
 * Grams left in each purchase after the uses, drawn first bought first used within each feed (the same
 * order costFeedUses charges them in). Uses that fail checkFeedUses draw what there is.
 */
export function stockLeftByPurchase(purchases: ReadonlyArray<FeedPurchase>, uses: ReadonlyArray<FeedUse>): Map<string, number> {
  const left = new Map(purchases.map((p) => [p.id, p.grams]));
  const feeds = new Set(purchases.map((p) => p.feedId));
  for (const feedId of feeds) {
    const lots = purchases.filter((p) => p.feedId === feedId).sort(byDateThenId((p) => p.boughtOn));
    for (const use of uses.filter((u) => u.feedId === feedId && u.grams > 0).sort(byDateThenId((u) => u.givenOn))) {
      let need = use.grams;
      for (const lot of lots) {
        if (need <= 0) break;
        if (lot.boughtOn > use.givenOn) break;
        const take = Math.min(need, left.get(lot.id)!);
        left.set(lot.id, left.get(lot.id)! - take);
        need -= take;
      }
    }
  }
  return left;
}

export interface FeedCostPerWeight {
  feedCostCents: number;
  perKgLive: number | null;
  perLbLive: number | null;
  perKgCarcass: number | null;
  perLbCarcass: number | null;
}

/**
 * Feed cost per kilogram and per pound of the live weight it produced (the gain of a grow-out, the
 * young of a doe + litter) and of the carcass weight processed from it.
 */
export function feedCostPerWeight(input: { feedCostCents: number; liveGrams?: number | null; carcassGrams?: number | null }): FeedCostPerWeight {
  cents(input.feedCostCents, 'The feed cost');
  const per = (grams: number | null | undefined, fn: (c: number, g: number) => number) => (grams && grams > 0 ? fn(input.feedCostCents, grams) : null);
  return {
    feedCostCents: input.feedCostCents,
    perKgLive: per(input.liveGrams, centsPerKg),
    perLbLive: per(input.liveGrams, centsPerLb),
    perKgCarcass: per(input.carcassGrams, centsPerKg),
    perLbCarcass: per(input.carcassGrams, centsPerLb),
  };
}
