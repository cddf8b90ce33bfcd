import { literal, Op, type Transaction } from 'sequelize';
import { checkFeedUses, costFeedUses, largestRemainder, stockLeftByPurchase, type FeedPurchase as PurchaseFact, type FeedUse as UseFact } from '@burrowline/shared';
import { FeedPurchase, FeedUse, FeedUseShare } from './feed.model';
import { groupBy } from '../../lib/group-by';

/**
 * A farm's feed book worked out: each use's cost (first bought, first used within a feed, in whole cents
 * that add up to what the feed cost), each purchase's stock left, and each use's split over groups and
 * nursing litters. Imports nothing of grow-out, so grow-out can read its groups' feed from here while
 * feed.service (which checks groups through grow-out) builds on it.
 */
export interface FeedLedger {
  purchases: FeedPurchase[];
  uses: FeedUse[];
  shares: FeedUseShare[];
  costByUse: Map<string, number>;
  leftByPurchase: Map<string, number>;
  /** The shares of each use and each use by id, indexed once (a farm's years of feed are thousands of rows). */
  sharesByUse: Map<string, FeedUseShare[]>;
  useById: Map<string, FeedUse>;
}

export const feedKeyOf = (productName: string) => productName.trim().toLowerCase().replace(/\s+/g, ' ');

export function purchaseFact(p: Pick<FeedPurchase, 'id' | 'productName' | 'boughtOn' | 'bagGrams' | 'bags' | 'priceCents'>): PurchaseFact {
  return { id: p.id, feedId: feedKeyOf(p.productName), boughtOn: p.boughtOn, grams: p.bagGrams * p.bags, priceCents: p.priceCents };
}

export function useFact(u: Pick<FeedUse, 'id' | 'feedKey' | 'givenOn' | 'grams'>): UseFact {
  return { id: u.id, feedId: u.feedKey, givenOn: u.givenOn, grams: u.grams };
}

/** Costs of the uses that pass the stock checks (all of them, unless rows were written around the service). */
export function costOfUses(purchases: PurchaseFact[], uses: UseFact[]): Map<string, number> {
  const bad = new Set(checkFeedUses(purchases, uses).map((i) => i.useId));
  return costFeedUses(purchases, uses.filter((u) => !bad.has(u.id)));
}

export async function feedLedgerOf(tx: Transaction, coopId: string, farmId: string): Promise<FeedLedger> {
  const purchases = await FeedPurchase.findAll({ where: { coopId, farmId }, order: [['boughtOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
  // Plain rows (raw) for uses and shares: years of feed are thousands of rows, read-only here, and model
  // instances cost more than the query.
  const uses = await FeedUse.findAll({ where: { coopId, farmId }, order: [['givenOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx, raw: true });
  const farmUses = literal(`(SELECT id FROM feed_uses WHERE farm_id = ${FeedUse.sequelize!.escape(farmId)})`);
  const shares = uses.length === 0 ? [] : await FeedUseShare.findAll({ where: { coopId, feedUseId: { [Op.in]: farmUses } }, transaction: tx, raw: true });
  const pf = purchases.map(purchaseFact);
  const uf = uses.map(useFact);
  const sharesByUse = groupBy(shares, (s) => s.feedUseId);
  return {
    purchases, uses, shares, costByUse: costOfUses(pf, uf), leftByPurchase: stockLeftByPurchase(pf, uf),
    sharesByUse, useById: new Map(uses.map((u) => [u.id, u])),
  };
}

/** What splitting uses over groups and litters needs of a ledger (the totals read only these columns). */
interface CostedShares {
  sharesByUse: Map<string, Pick<FeedUseShare, 'groupId' | 'litterId' | 'grams'>[]>;
  useById: Map<string, Pick<FeedUse, 'grams'>>;
  costByUse: Map<string, number>;
  uses: Pick<FeedUse, 'id'>[];
}

/** The shares of one use with their cents: the use's cost split by grams, to the cent (largest remainder). */
export function sharesWithCost(ledger: CostedShares, useId: string): { groupId: string | null; litterId: string | null; grams: number; costCents: number }[] {
  const shares = ledger.sharesByUse.get(useId) ?? [];
  if (shares.length === 0) return [];
  const use = ledger.useById.get(useId)!;
  const cost = ledger.costByUse.get(useId) ?? 0;
  const sharedGrams = shares.reduce((n, s) => n + s.grams, 0);
  // Shares cover all of the use's grams; the cost part they carry follows their grams.
  const sharedCost = sharedGrams >= use.grams ? cost : Math.round((cost * sharedGrams) / use.grams);
  const cents = sharedGrams > 0 ? largestRemainder(sharedCost, shares.map((s) => s.grams)) : shares.map(() => 0);
  return shares.map((s, i) => ({ groupId: s.groupId, litterId: s.litterId, grams: s.grams, costCents: cents[i]! }));
}

type Totals = Map<string, { grams: number; costCents: number }>;

/** One pass over the feed book: each use's shares with their cents, added up by group and by nursing litter. */
function totalsOf(ledger: CostedShares): { byGroup: Totals; byLitter: Totals } {
  const byGroup: Totals = new Map();
  const byLitter: Totals = new Map();
  const add = (totals: Totals, id: string, grams: number, costCents: number) => {
    const t = totals.get(id) ?? { grams: 0, costCents: 0 };
    t.grams += grams;
    t.costCents += costCents;
    totals.set(id, t);
  };
  for (const use of ledger.uses) {
    for (const share of sharesWithCost(ledger, use.id)) {
      if (share.groupId) add(byGroup, share.groupId, share.grams, share.costCents);
      if (share.litterId) add(byLitter, share.litterId, share.grams, share.costCents);
    }
  }
  return { byGroup, byLitter };
}

/** Feed of each grow-out group and of each nursing litter (with its doe) of a farm, from one reading of its feed book. */
export async function feedTotalsOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<{ byGroup: Totals; byLitter: Totals }> {
  // The same book as feedLedgerOf, with only the columns the costs and splits use (years of rows).
  // Purchases are few; as models, so their money columns come back as numbers.
  const purchases = await FeedPurchase.findAll({ where: { coopId, farmId }, order: [['boughtOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
  const uses = await FeedUse.findAll({
    where: { coopId, farmId }, attributes: ['id', 'feedKey', 'givenOn', 'grams'], order: [['givenOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx, raw: true,
  });
  const farmUses = literal(`(SELECT id FROM feed_uses WHERE farm_id = ${FeedUse.sequelize!.escape(farmId)})`);
  // The shares exactly as the book reads them: their order settles how a use's odd cents are split.
  const shares = uses.length === 0 ? [] : await FeedUseShare.findAll({ where: { coopId, feedUseId: { [Op.in]: farmUses } }, transaction: tx, raw: true });
  return totalsOf({
    uses, costByUse: costOfUses(purchases.map(purchaseFact), uses.map(useFact)), sharesByUse: groupBy(shares, (s) => s.feedUseId),
    useById: new Map(uses.map((u) => [u.id, u])),
  });
}

/** Feed of each grow-out group of a farm, its own and its share of pen- and farm-wide feed. */
export async function feedTotalsByGroup(tx: Transaction, coopId: string, farmId: string): Promise<Totals> {
  return (await feedTotalsOfFarm(tx, coopId, farmId)).byGroup;
}

/** Feed of each nursing litter (with its doe) of a farm, its own and its share of pen- and farm-wide feed. */
export async function feedTotalsByLitter(tx: Transaction, coopId: string, farmId: string): Promise<Totals> {
  return (await feedTotalsOfFarm(tx, coopId, farmId)).byLitter;
}
