import { asTenant } from './db';

/**
 * Copies of one row, `count` times, inside its co-op (as the app role, under row-level security): fast
 * arrangement of many rows for tests that compare an endpoint at 10 and at 1,000 rows. `fresh` gives SQL
 * expressions per column for what must differ between copies (unique keys); `g` is the copy's number.
 */
export async function copyRow(coopId: string, table: string, id: string, count: number, fresh: Record<string, string> = {}): Promise<void> {
  if (count <= 0) return;
  const overrides = Object.entries({ id: 'gen_random_uuid()', ...fresh })
    .map(([column, sql]) => `'${column}', ${sql}`)
    .join(', ');
  await asTenant(
    coopId,
    (client) =>
      client.query(
        `INSERT INTO ${table}
           SELECT (jsonb_populate_record(NULL::${table}, to_jsonb(t) || jsonb_build_object(${overrides}))).*
             FROM ${table} t, generate_series(1, $2::int) g
            WHERE t.id = $1`,
        [id, count],
      ),
    { commit: true },
  );
}

/** Copies of a litter, each with a copy of its own service (a service has at most one litter). */
export async function copyLitter(coopId: string, litterId: string, count: number): Promise<void> {
  if (count <= 0) return;
  await asTenant(
    coopId,
    (client) =>
      client.query(
        `WITH copies AS (
           INSERT INTO services
             SELECT (jsonb_populate_record(NULL::services, to_jsonb(s) || jsonb_build_object('id', gen_random_uuid()))).*
               FROM services s JOIN litters l ON l.service_id = s.id, generate_series(1, $2::int)
              WHERE l.id = $1
           RETURNING id)
         INSERT INTO litters
           SELECT (jsonb_populate_record(NULL::litters, to_jsonb(l) || jsonb_build_object('id', gen_random_uuid(), 'service_id', c.id))).*
             FROM litters l, copies c
            WHERE l.id = $1`,
        [litterId, count],
      ),
    { commit: true },
  );
}

/** How many rows of `table` the co-op has (optionally only those matching `where`, with $2…). */
export async function rowCount(coopId: string, table: string, where = 'true', values: unknown[] = []): Promise<number> {
  return asTenant(coopId, async (client) => {
    const { rows } = await client.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${table} WHERE coop_id = $1 AND ${where}`, [coopId, ...values]);
    return rows[0]!.n;
  });
}
