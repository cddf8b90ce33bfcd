import type { Transaction } from 'sequelize';
import { selectRows } from '../../db/prepared';
import { FeedPurchase, FeedUse } from './feed.model';
import { storeFeedBookFigures } from '../../db/feed-book-figures';


/**
 * A farm's feed book as its changes check it: every purchase and every use, first bought first used.
 * Imports nothing of grow-out, so grow-out can read its groups' feed from here while feed.service (which
 * checks groups through grow-out) builds on it.
 */
export interface FeedLedger {
  purchases: FeedPurchase[];
  uses: FeedUse[];
  useById: Map<string, FeedUse>;
}

export async function feedLedgerOf(tx: Transaction, coopId: string, farmId: string): Promise<FeedLedger> {
  const purchases = await FeedPurchase.findAll({ where: { coopId, farmId }, order: [['boughtOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
  // Plain rows: years of feed are thousands of rows, read-only here, and model instances cost more than the query.
  const uses = await FeedUse.findAll({ where: { coopId, farmId }, order: [['givenOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx, raw: true });
  return { purchases, uses, useById: new Map(uses.map((u) => [u.id, u])) };
}

/** After any change to a farm's book (under its lock): its stock left and costs worked anew and stored. */
export function refreshFeedBook(tx: Transaction, coopId: string, farmId: string): Promise<void> {
  return storeFeedBookFigures((sql, bind) => selectRows(tx, sql, bind), coopId, farmId);
}

type Totals = Map<string, { grams: number; costCents: number }>;

/** Feed of each grow-out group and of each nursing litter (with its doe) of a farm: the stored shares added up. */
export async function feedTotalsOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<{ byGroup: Totals; byLitter: Totals }> {
  const rows = await selectRows<{ group_id: string | null; litter_id: string | null; grams: string; cost_cents: string }>(
    tx,
    `SELECT s.group_id, s.litter_id, sum(s.grams) AS grams, coalesce(sum(s.cost_cents), 0) AS cost_cents
     FROM feed_use_shares s JOIN feed_uses u ON u.coop_id = s.coop_id AND u.id = s.feed_use_id
     WHERE u.coop_id = $1 AND u.farm_id = $2 AND u.deleted_at IS NULL
     GROUP BY s.group_id, s.litter_id`,
    [coopId, farmId],
  );
  const byGroup: Totals = new Map();
  const byLitter: Totals = new Map();
  for (const r of rows) {
    const total = { grams: Number(r.grams), costCents: Number(r.cost_cents) };
    if (r.group_id) byGroup.set(r.group_id, total);
    else if (r.litter_id) byLitter.set(r.litter_id, total);
  }
  return { byGroup, byLitter };
}

/** Feed of each grow-out group of a farm, its own and its share of pen- and farm-wide feed. */
export async function feedTotalsByGroup(tx: Transaction, coopId: string, farmId: string): Promise<Totals> {
  return (await feedTotalsOfFarm(tx, coopId, farmId)).byGroup;
}

/** Feed of each nursing litter (with its doe) of a farm, its own and its share of pen- and farm-wide feed. */
export async function feedTotalsByLitter(tx: Transaction, coopId: string, farmId: string): Promise<Totals> {
  return (await feedTotalsOfFarm(tx, coopId, farmId)).byLitter;
}
