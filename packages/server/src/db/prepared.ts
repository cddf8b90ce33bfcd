import { createHash } from 'node:crypto';
import type pg from 'pg';
import type { Transaction } from 'sequelize';

/**
 * A hot read sent as a named prepared statement on the transaction's connection: PostgreSQL parses and
 * plans it once per connection (after a few runs, one generic plan) instead of on every request, which
 * for the list queries costs more than running them. The name is the text's hash, so a text is prepared
 * once per connection and two texts never share a name. Keep it for statements whose text varies only
 * with a small set of options (sorts, filters); values always travel as parameters.
 */
export async function selectPrepared<T extends object>(tx: Transaction, sql: string, bind: unknown[]): Promise<T[]> {
  const client = (tx as unknown as { connection: pg.Client }).connection;
  const name = `p_${createHash('sha1').update(sql).digest('base64url')}`;
  const { rows } = await client.query<T>({ name, text: sql, values: bind });
  return rows;
}
