import { figuresOfBook, type BookPurchase, type BookShare, type BookUse } from '@burrowline/shared';

/*
 * The feed book stores its worked figures beside its rows. The statements live here, below the modules,
 * so the migration that first stored them and the feed service run the same ones.
 */

/** A query runner: the service's transaction or the migration's connection. */
export type RunSql = <T extends object>(sql: string, bind: unknown[]) => Promise<T[]>;

/**
 * Works out a farm's whole book and stores what changed: stock left on purchases, cost on uses and on
 * their shares. Called after every change to the book, under the farm's lock.
 */
export async function storeFeedBookFigures(run: RunSql, coopId: string, farmId: string): Promise<void> {
  const purchases = await run<BookPurchase>(
    `SELECT id, product_name AS "productName", bought_on::text AS "boughtOn", bag_grams AS "bagGrams", bags, price_cents AS "priceCents"
     FROM feed_purchases WHERE coop_id = $1 AND farm_id = $2 AND deleted_at IS NULL`,
    [coopId, farmId],
  );
  const uses = await run<BookUse>(
    `SELECT id, feed_key AS "feedKey", given_on::text AS "givenOn", grams
     FROM feed_uses WHERE coop_id = $1 AND farm_id = $2 AND deleted_at IS NULL`,
    [coopId, farmId],
  );
  const shares = await run<BookShare>(
    `SELECT s.id::text AS id, s.feed_use_id AS "feedUseId", s.grams
     FROM feed_use_shares s JOIN feed_uses u ON u.coop_id = s.coop_id AND u.id = s.feed_use_id
     WHERE u.coop_id = $1 AND u.farm_id = $2 AND u.deleted_at IS NULL ORDER BY s.id`,
    [coopId, farmId],
  );
  const figures = figuresOfBook(purchases, uses, shares);
  if (purchases.length > 0) {
    await run(
      `UPDATE feed_purchases p SET grams_left = v.left_grams FROM unnest($2::uuid[], $3::bigint[]) AS v(id, left_grams)
       WHERE p.coop_id = $1 AND p.id = v.id AND p.grams_left IS DISTINCT FROM v.left_grams`,
      [coopId, purchases.map((p) => p.id), purchases.map((p) => figures.gramsLeftByPurchase.get(p.id) ?? 0)],
    );
  }
  if (uses.length > 0) {
    await run(
      `UPDATE feed_uses u SET cost_cents = v.cost FROM unnest($2::uuid[], $3::bigint[]) AS v(id, cost)
       WHERE u.coop_id = $1 AND u.id = v.id AND u.cost_cents IS DISTINCT FROM v.cost`,
      [coopId, uses.map((u) => u.id), uses.map((u) => figures.costByUse.get(u.id) ?? null)],
    );
  }
  if (shares.length > 0) {
    await run(
      `UPDATE feed_use_shares s SET cost_cents = v.cost FROM unnest($2::bigint[], $3::bigint[]) AS v(id, cost)
       WHERE s.coop_id = $1 AND s.id = v.id AND s.cost_cents IS DISTINCT FROM v.cost`,
      [coopId, shares.map((s) => s.id), shares.map((s) => figures.costByShare.get(s.id) ?? 0)],
    );
  }
}
