import { createRequire } from 'node:module';
import type pg from 'pg';
import type { Sequelize, Transaction } from 'sequelize';

/**
 * A tenant transaction opens together with its first statement: `START TRANSACTION`, the co-op for
 * row-level security (`set_config(..., true)`, local to the transaction) and the first statement go in
 * one round trip, and a transaction that sent nothing ends without one. Row-level security stays forced;
 * the setting is in place before any statement of the transaction runs.
 */

const TENANT_OPTION = 'tenantCoopId';
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The SQL that opens a tenant transaction, waiting on its connection for the first statement. */
const pendingOpening = new WeakMap<object, string>();

/** Whether the connection's transaction is still to open with the next statement (which then goes as text). */
export function openingPendingOn(connection: object): boolean {
  return pendingOpening.has(connection);
}

/** Transaction options that make Sequelize open the transaction for this co-op with its first statement. */
export function tenantTransactionOptions(coopId: string): object {
  // Inlined as a literal so it can share a simple-protocol round trip: only a well-formed id is accepted.
  if (!UUID.test(coopId)) throw new Error('A tenant transaction needs the co-op id');
  return { [TENANT_OPTION]: coopId };
}

type Callback = (error: Error | null, result?: unknown) => void;
type Send = (...args: unknown[]) => unknown;

/**
 * The first statement with its values written in as quoted literals, so that it can travel in the
 * simple protocol beside the opening. An untyped quoted literal takes its type from where it stands,
 * as an untyped parameter does. Null when a value cannot be written so (binary data) or the text has
 * no simple shape; the opening then goes on its own.
 */
export function inlineParameters(text: string, values: readonly unknown[], quote: (value: string) => string): string | null {
  const literals = literalsOf(values, quote);
  if (literals === null) return null;
  let out = '';
  let i = 0;
  while (i < text.length) {
    const c = text[i]!;
    const next = text[i + 1];
    if (c === "'" || c === '"') {
      // A quoted string or identifier; a doubled quote stays inside. E'…' strings escape with backslashes.
      const escapes = c === "'" && /[eE]/.test(text[i - 1] ?? '') && !/[\w$]/.test(text[i - 2] ?? '');
      let j = i + 1;
      while (j < text.length) {
        if (escapes && text[j] === '\\') j += 2;
        else if (text[j] === c && text[j + 1] === c) j += 2;
        else if (text[j] === c) break;
        else j += 1;
      }
      if (j >= text.length) return null;
      out += text.slice(i, j + 1);
      i = j + 1;
    } else if (c === '-' && next === '-') {
      const end = text.indexOf('\n', i);
      if (end < 0) return null;
      out += text.slice(i, end);
      i = end;
    } else if (c === '/' && next === '*') {
      const end = text.indexOf('*/', i + 2);
      if (end < 0) return null;
      out += text.slice(i, end + 2);
      i = end + 2;
    } else if (c === '$' && next !== undefined && /\d/.test(next) && !/[\w$]/.test(text[i - 1] ?? '')) {
      const match = /^\$(\d+)/.exec(text.slice(i))!;
      const literal = literals[Number(match[1]) - 1];
      if (literal === undefined) return null;
      out += literal;
      i += match[0].length;
    } else if (c === '$' && !/[\w$]/.test(text[i - 1] ?? '')) {
      const tag = /^\$([A-Za-z_][A-Za-z0-9_]*)?\$/.exec(text.slice(i));
      if (!tag) {
        out += c;
        i += 1;
        continue;
      }
      const end = text.indexOf(tag[0], i + tag[0].length);
      if (end < 0) return null;
      out += text.slice(i, end + tag[0].length);
      i = end + tag[0].length;
    } else {
      out += c;
      i += 1;
    }
  }
  return out;
}

const NOT_TEXT = Symbol('not text');

/** pg's own conversion of a value for the wire, so an inlined value reads exactly as the parameter would. */
const prepareValue = (createRequire(import.meta.url)('pg/lib/utils') as { prepareValue: (value: unknown) => unknown }).prepareValue;

/** A value's text as pg sends it (arrays as array literals, objects as JSON, dates in pg's format); binary data has none. */
function textOf(value: unknown): string | null | typeof NOT_TEXT {
  const prepared = prepareValue(value);
  if (prepared === null || prepared === undefined) return null;
  return typeof prepared === 'string' ? prepared : NOT_TEXT;
}

/** Values as SQL literals (`NULL` or quoted text, typed by where they stand); null when one has no text form (binary data). */
export function literalsOf(values: readonly unknown[], quote: (value: string) => string): string[] | null {
  const literals: string[] = [];
  for (const value of values) {
    const text = textOf(value);
    if (text === NOT_TEXT) return null;
    literals.push(text === null ? 'NULL' : quote(text));
  }
  return literals;
}

/**
 * A read that is its transaction's only statement may end it in the same round trip: the opening, the read
 * and `COMMIT` go together (`endWithNextStatement`), and the transaction's own COMMIT or ROLLBACK is then
 * answered without one. Should another statement follow after all, the transaction opens anew for it.
 */
const endWithNext = new WeakSet<object>();
const endedOpening = new WeakMap<object, string>();

/** Asks that the connection's pending opening, if any, travel with the next statement and end with it (reads only). */
export function endWithNextStatement(connection: object): void {
  if (pendingOpening.has(connection)) endWithNext.add(connection);
}

/** What the opened connection answers for the statement that followed the opening (without a COMMIT sent after it). */
function ownResults(result: unknown, ended: boolean): unknown {
  if (!Array.isArray(result)) return result;
  const own = result.slice(2, ended ? -1 : undefined);
  return own.length === 1 ? own[0] : own;
}

function sendOpeningFirst(client: pg.Client): void {
  // Looked up on each call, so instrumentation of pg's client (the tests' statement counter) sees each round trip.
  const send: Send = (...args) => (Object.getPrototypeOf(client) as { query: Send }).query.apply(client, args);
  (client as unknown as { query: Send }).query = (...args: unknown[]) => {
    const [text, second, third] = args;
    const callback = (typeof second === 'function' ? second : third) as Callback | undefined;
    const ended = endedOpening.get(client);
    if (ended !== undefined) {
      endedOpening.delete(client);
      if (typeof text === 'string' && /^\s*(COMMIT|ROLLBACK)\s*;?\s*$/i.test(text) && typeof callback === 'function') {
        // Already committed with its one statement: there is nothing left to end.
        process.nextTick(callback, null, { command: text.trim().replace(/;$/, '').toUpperCase(), rowCount: null, rows: [], fields: [] });
        return undefined;
      }
      pendingOpening.set(client, ended);
    }
    const opening = pendingOpening.get(client);
    if (opening === undefined) return send(...args);
    pendingOpening.delete(client);
    const ending = endWithNext.has(client);
    endWithNext.delete(client);
    const values = (typeof second === 'function' ? [] : (second ?? [])) as unknown[];
    if (typeof text !== 'string' || typeof callback !== 'function') {
      // Not the shape Sequelize sends: open on its own first.
      return (send(opening) as Promise<unknown>).then(() => send(...args));
    }
    if (/^\s*(COMMIT|ROLLBACK)\s*;?\s*$/i.test(text)) {
      // Nothing was sent, so nothing was opened: there is nothing to end.
      process.nextTick(callback, null, { command: text.trim().replace(/;$/, '').toUpperCase(), rowCount: null, rows: [], fields: [] });
      return undefined;
    }
    const inline = values.length === 0 ? text : inlineParameters(text, values, (v) => client.escapeLiteral(v));
    if (inline !== null) {
      return send(ending ? `${opening}${inline}\n; COMMIT` : opening + inline, (error: Error | null, result: unknown) => {
        if (!error && ending) endedOpening.set(client, opening);
        callback(error, error ? result : ownResults(result, ending));
      });
    }
    return send(opening, (error: Error | null) => (error ? callback(error) : send(text, values, callback)));
  };
}

/**
 * Teaches the connection pool to open tenant transactions lazily (see above); transactions without the
 * tenant option (migrations, the mail outbox) open as Sequelize always does.
 */
export function openTenantTransactionsWithFirstStatement(sequelize: Sequelize): void {
  sequelize.addHook('afterConnect', (connection: unknown) => sendOpeningFirst(connection as pg.Client));
  const queryInterface = sequelize.getQueryInterface();
  const startTransaction = queryInterface.startTransaction.bind(queryInterface);
  queryInterface.startTransaction = async (transaction: Transaction, options) => {
    const coopId = (transaction as unknown as { options: Record<string, unknown>; parent?: Transaction }).options[TENANT_OPTION];
    const connection = (transaction as unknown as { connection?: object }).connection;
    // A new transaction on the connection: nothing of an earlier one's ended opening carries over.
    if (connection && !(transaction as unknown as { parent?: Transaction }).parent) endedOpening.delete(connection);
    if (typeof coopId !== 'string' || !UUID.test(coopId) || !connection || (transaction as unknown as { parent?: Transaction }).parent) {
      return startTransaction(transaction, options);
    }
    // Generic plans for the transaction's prepared statements: their parameters are ids, so one plan serves
    // every co-op, and planning each run (what the default does for most of our lists) costs more than it saves.
    pendingOpening.set(connection, `START TRANSACTION; SELECT set_config('app.coop_id', '${coopId}', true), set_config('plan_cache_mode', 'force_generic_plan', true); `);
    return undefined as never;
  };
}
