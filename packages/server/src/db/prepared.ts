import { createHash } from 'node:crypto';
import type pg from 'pg';
import type { Transaction } from 'sequelize';
import { openingPendingOn } from './tenant-opening';

/*
 * Reads straight on the transaction's pg connection, for the hot paths every request takes: no model
 * instances and no query building, rows as pg parses them (Sequelize's own type parsers apply, they are
 * the connection's). Errors are pg's own, which the error handler and the retry rules already know.
 */

const connectionOf = (tx: Transaction) => (tx as unknown as { connection: pg.Client }).connection;

/** Rows of `sql` with positional parameters `$1…` in `bind`; as the first statement it travels with the opening. */
export function selectRows<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  const client = connectionOf(tx);
  return new Promise((resolve, reject) => {
    // The (text, values, callback) shape, the one the lazy tenant opening joins to itself.
    client.query(sql, bind, (error: Error | undefined, result: pg.QueryResult) => (error ? reject(error) : resolve(result.rows as T[])));
  });
}

/**
 * `selectRows` as a named prepared statement: PostgreSQL parses and plans it once per connection (after a
 * few runs, one generic plan) instead of on every request, which for the list queries costs more than
 * running them. The name is the text's hash, so a text is prepared once per connection and two texts never
 * share a name. Keep it for statements whose text varies only with a small set of options (sorts,
 * filters); values always travel as parameters. As a transaction's first statement it goes as text, with
 * the opening.
 */
export async function selectPrepared<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  const client = connectionOf(tx);
  if (openingPendingOn(client)) return selectRows<T>(tx, sql, bind);
  const name = `p_${createHash('sha1').update(sql).digest('base64url')}`;
  const { rows } = await client.query<T>({ name, text: sql, values: bind });
  return rows;
}
