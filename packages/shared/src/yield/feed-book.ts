import { checkFeedUses, costFeedUses, stockLeftByPurchase, type FeedPurchase as PurchaseFact, type FeedUse as UseFact } from './feed-cost';
import { largestRemainder } from './allocation';

/* A farm's feed book worked out from its rows as stored: what the book keeps beside them. */

/** A purchase, a use and a share as the figures need them. */
export interface BookPurchase { id: string; productName: string; boughtOn: string; bagGrams: number; bags: number; priceCents: number }
export interface BookUse { id: string; feedKey: string; givenOn: string; grams: number }
export interface BookShare { id: string; feedUseId: string; grams: number }

export const feedKeyOf = (productName: string) => productName.trim().toLowerCase().replace(/\s+/g, ' ');

export function purchaseFact(p: BookPurchase): PurchaseFact {
  return { id: p.id, feedId: feedKeyOf(p.productName), boughtOn: p.boughtOn, grams: p.bagGrams * p.bags, priceCents: Number(p.priceCents) };
}

export function useFact(u: BookUse): UseFact {
  return { id: u.id, feedId: u.feedKey, givenOn: u.givenOn, grams: u.grams };
}

/** Costs of the uses that pass the stock checks (all of them, unless rows were written around the service). */
export function costOfUses(purchases: PurchaseFact[], uses: UseFact[]): Map<string, number> {
  const bad = new Set(checkFeedUses(purchases, uses).map((i) => i.useId));
  return costFeedUses(purchases, uses.filter((u) => !bad.has(u.id)));
}

/** What the book stores beside its rows, so a page of it is read without working the whole book again. */
export interface BookFigures {
  gramsLeftByPurchase: Map<string, number>;
  /** Null for feed given that the book cannot cover (rows written around the service). */
  costByUse: Map<string, number | null>;
  costByShare: Map<string, number>;
}

/**
 * The figures of a whole feed book: each purchase's stock left and each use's cost, first bought first
 * used; each use's cost split over its shares by grams, to the cent (largest remainder, shares in the
 * order they were written).
 */
export function figuresOfBook(purchases: BookPurchase[], uses: BookUse[], shares: BookShare[]): BookFigures {
  const pf = purchases.map(purchaseFact);
  const uf = uses.map(useFact);
  const costed = costOfUses(pf, uf);
  const costByUse = new Map<string, number | null>(uses.map((u) => [u.id, costed.get(u.id) ?? null]));
  const gramsOfUse = new Map(uses.map((u) => [u.id, u.grams]));
  const byUse = new Map<string, BookShare[]>();
  for (const s of shares) {
    const list = byUse.get(s.feedUseId);
    if (list) list.push(s);
    else byUse.set(s.feedUseId, [s]);
  }
  const costByShare = new Map<string, number>();
  for (const [useId, list] of byUse) {
    const useGrams = gramsOfUse.get(useId);
    if (useGrams === undefined) continue;
    const cost = costByUse.get(useId) ?? 0;
    const sharedGrams = list.reduce((n, s) => n + s.grams, 0);
    // Shares cover all of the use's grams; the cost part they carry follows their grams.
    const sharedCost = sharedGrams >= useGrams ? cost : Math.round((cost * sharedGrams) / useGrams);
    const cents = sharedGrams > 0 ? largestRemainder(sharedCost, list.map((s) => s.grams)) : list.map(() => 0);
    list.forEach((s, i) => costByShare.set(s.id, cents[i]!));
  }
  return { gramsLeftByPurchase: stockLeftByPurchase(pf, uf), costByUse, costByShare };
}

