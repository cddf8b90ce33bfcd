import { ownerDb } from './db';

/**
 * A cheap picture of every row some co-ops own, to tell whether a request wrote anything: per table, the
 * number of the co-ops' rows and the sum of their `xmin` (the id of the transaction that wrote each row
 * version). An insert or a delete changes the count; an update writes a new row version with a newer
 * transaction id, so it changes the sum. Row counts of `pg_stat_user_tables` would not do: they count
 * rolled-back writes and reach the view late.
 */
export type Fingerprint = Record<string, string>;

/** Rows a refusal writes on purpose, left out: a failed sign-in is recorded for the throttle and the audit log. */
const EXPECTED_WRITES: Record<string, string> = {
  audit_events: `AND action <> 'sign_in.failed'`,
};
/** Tables whose rows background work changes later (the outbox worker marks mail sent): only their count is kept. */
const COUNT_ONLY = new Set(['email_outbox']);

let statement: Promise<string> | null = null;

/** One statement over every table with a `coop_id` (found when first used, so new tables are covered too), and the co-op itself. */
function fingerprintStatement(): Promise<string> {
  statement ??= ownerDb(async (c) => {
    const tables = await c.query<{ table_name: string }>(
      `SELECT table_name FROM information_schema.columns
        WHERE table_schema = 'public' AND column_name = 'coop_id'
          AND table_name IN (SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE')
        ORDER BY table_name`,
    );
    const parts = tables.rows.map(({ table_name: table }) => {
      const versions = COUNT_ONLY.has(table) ? `'-'` : `coalesce(sum(xmin::text::bigint), 0)::text`;
      return `SELECT '${table}' AS t, count(*)::text || ':' || ${versions} AS f FROM "${table}" WHERE coop_id = $1 ${EXPECTED_WRITES[table] ?? ''}`;
    });
    parts.push(`SELECT 'cooperatives', count(*)::text || ':' || coalesce(sum(xmin::text::bigint), 0)::text FROM cooperatives WHERE id = $1`);
    return parts.join('\nUNION ALL ');
  });
  statement.catch(() => (statement = null));
  return statement;
}

/** The fingerprint of the co-ops' rows, read through their row-level security as the owner role. */
export async function fingerprintOf(coopIds: string[]): Promise<Fingerprint> {
  const sql = await fingerprintStatement();
  return ownerDb(async (c) => {
    const print: Fingerprint = {};
    await c.query('BEGIN READ ONLY');
    await c.query('SET LOCAL jit = off');
    try {
      for (const coopId of coopIds) {
        await c.query(`SELECT set_config('app.coop_id', $1, true)`, [coopId]);
        // Prepared once per connection: planning this many tables costs more than running them.
        const rows = (await c.query<{ t: string; f: string }>({ name: `fingerprint-${sql.length}`, text: sql, values: [coopId] })).rows;
        for (const row of rows) print[`${coopId.slice(0, 8)} ${row.t}`] = row.f;
      }
    } finally {
      await c.query('ROLLBACK');
    }
    return print;
  });
}

/** The tables whose fingerprint differs, with both values, for a failure message. */
export function changedTables(before: Fingerprint, after: Fingerprint): string[] {
  return Object.keys({ ...before, ...after })
    .filter((key) => before[key] !== after[key])
    .map((key) => `${key}: ${before[key] ?? 'none'} → ${after[key] ?? 'none'}`);
}
