import { createHash } from 'node:crypto';
import type pg from 'pg';
import type { Transaction } from 'sequelize';
import { endWithNextStatement, literalsOf, openingPendingOn } from './tenant-opening';

/*
 * Reads straight on the transaction's pg connection, for the hot paths every request takes: no model
 * instances and no query building, rows as pg parses them (Sequelize's own type parsers apply, they are
 * the connection's). Errors are pg's own, which the error handler and the retry rules already know.
 */

const connectionOf = (tx: Transaction) => (tx as unknown as { connection: pg.Client }).connection;

type Callback = (error: Error | undefined, result: pg.QueryResult | pg.QueryResult[]) => void;

/** Rows of `sql` with positional parameters `$1…` in `bind`; as the first statement it travels with the opening. */
export function selectRows<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  const client = connectionOf(tx);
  return new Promise((resolve, reject) => {
    // The (text, values, callback) shape, the one the lazy tenant opening joins to itself.
    (client.query as unknown as (text: string, values: unknown[], callback: Callback) => void)(sql, bind, (error, result) =>
      error ? reject(error) : resolve(lastOf(result).rows as T[]));
  });
}

const lastOf = (result: pg.QueryResult | pg.QueryResult[]) => (Array.isArray(result) ? result[result.length - 1]! : result);

/** The statements pg knows are prepared on a connection (its own record, which it consults before parsing again). */
const preparedOn = (client: pg.Client) => (client as unknown as { connection: { parsedStatements: Record<string, string> } }).connection.parsedStatements;

/**
 * Names an SQL `PREPARE` was sent for in a round trip that then failed: PREPARE is not undone by a rollback,
 * so whether the connection holds the statement is asked before it is used again.
 */
const uncertainOn = new WeakMap<pg.Client, Set<string>>();

async function settleUncertain(tx: Transaction, client: pg.Client, name: string, sql: string): Promise<void> {
  const uncertain = uncertainOn.get(client);
  if (!uncertain?.has(name)) return;
  const rows = await selectRows(tx, 'SELECT 1 FROM pg_prepared_statements WHERE name = $1', [name]);
  if (rows.length > 0) preparedOn(client)[name] = sql;
  uncertain.delete(name);
}

/** The name a text is prepared under (its hash: one name per text, never two texts under one name). */
export function preparedNameOf(sql: string): string {
  return `p_${createHash('sha1').update(sql).digest('base64url')}`;
}

/**
 * `selectRows` as a named prepared statement: PostgreSQL parses and plans it once per connection (one generic
 * plan, see tenant-opening.ts) instead of on every request, which for the list queries costs more than
 * running them. The name is the text's hash, so a text is prepared once per connection and two texts never
 * share a name. Keep it for statements whose text varies only with a small set of options (sorts, filters);
 * values always travel as parameters. As a transaction's first statement it travels with the opening in one
 * round trip, as SQL `PREPARE` (once per connection) and `EXECUTE` with its values written in.
 */
export async function selectPrepared<T extends object>(
  tx: Transaction,
  sql: string,
  bind: unknown[] = [],
  opts: {
    /**
     * The read is all its transaction sends (a list read in one statement): as the first statement it then
     * ends the transaction in the same round trip, instead of a COMMIT of its own (see tenant-opening.ts).
     */
    onlyStatement?: boolean;
  } = {},
): Promise<T[]> {
  const client = connectionOf(tx);
  const name = preparedNameOf(sql);
  await settleUncertain(tx, client, name, sql);
  if (openingPendingOn(client)) {
    if (opts.onlyStatement) endWithNextStatement(client);
    const literals = literalsOf(bind, (value) => client.escapeLiteral(value));
    if (literals === null) return selectRows<T>(tx, sql, bind);
    const quoted = `"${name}"`;
    const prepare = preparedOn(client)[name] === undefined ? `PREPARE ${quoted} AS ${sql}\n; ` : '';
    const execute = `EXECUTE ${quoted}${literals.length > 0 ? `(${literals.join(', ')})` : ''}`;
    if (prepare) {
      if (!uncertainOn.has(client)) uncertainOn.set(client, new Set());
      uncertainOn.get(client)!.add(name);
    }
    const rows = await selectRows<T>(tx, prepare + execute);
    if (prepare) {
      preparedOn(client)[name] = sql;
      uncertainOn.get(client)!.delete(name);
    }
    return rows;
  }
  const { rows } = await client.query<T>({ name, text: sql, values: bind });
  return rows;
}
