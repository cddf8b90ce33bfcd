import { describe, expect, it } from 'vitest';
import { ownerDb } from '../support/db';

describe('indexes that leave the planner one good choice', () => {
  it('when an index\'s columns are a leading part of another index on the same table, then the shorter one is partial or unique (else it is a trap)', async () => {
    // While a table's statistics say "empty" (a large load in one transaction), the planner costs an index
    // on (coop_id) the same as the unique (coop_id, id) for a look-up of one row, and may walk every row of
    // the co-op through the first; a foreign-key check made that walk once per row loaded.
    const redundant = await ownerDb(async (c) => (await c.query<{ redundant: string; covered_by: string }>(
      `SELECT a.indexrelid::regclass::text AS redundant, b.indexrelid::regclass::text AS covered_by
       FROM pg_index a
       JOIN pg_index b ON b.indrelid = a.indrelid AND b.indexrelid <> a.indexrelid
       JOIN pg_class t ON t.oid = a.indrelid
       WHERE t.relnamespace = 'public'::regnamespace
         AND NOT a.indisunique AND a.indpred IS NULL AND a.indexprs IS NULL AND b.indpred IS NULL AND b.indexprs IS NULL
         AND a.indnkeyatts < b.indnkeyatts
         AND (b.indkey::int2[])[0:a.indnkeyatts - 1] = (a.indkey::int2[])[0:a.indnkeyatts - 1]
       ORDER BY 1`,
    )).rows);
    expect(redundant).toEqual([]);
  });

  it('when a same-co-op foreign key names an animal, then its check is planned on the unique (coop_id, id) key', async () => {
    const plan = await ownerDb(async (c) => {
      await c.query('BEGIN');
      try {
        await c.query(`SET LOCAL plan_cache_mode = force_generic_plan`);
        await c.query(`PREPARE fk_check(uuid, uuid) AS SELECT 1 FROM ONLY animals x WHERE coop_id = $1 AND id = $2 FOR KEY SHARE OF x`);
        const rows = (await c.query<{ 'QUERY PLAN': string }>(`EXPLAIN EXECUTE fk_check(gen_random_uuid(), gen_random_uuid())`)).rows;
        return rows.map((r) => r['QUERY PLAN']).join('\n');
      } finally {
        await c.query('ROLLBACK');
        await c.query('DEALLOCATE ALL');
      }
    });
    expect(plan).toMatch(/Index Cond: \(\(coop_id = \$1\) AND \(id = \$2\)\)/);
  });
});
