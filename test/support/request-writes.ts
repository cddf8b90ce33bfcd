import { AsyncLocalStorage } from 'node:async_hooks';
import type { IncomingMessage, ServerResponse } from 'node:http';
import pg from 'pg';

/**
 * Whether serving one request could have written a row: it committed a transaction that was given a
 * transaction id (PostgreSQL gives one at the first write or row lock, and a read-only transaction never gets
 * one), or it sent a statement outside a transaction. A request that did neither (refused before the database,
 * a read, a transaction rolled back) wrote nothing, so the fingerprint of the database need not be read after it. Every round trip goes
 * through `pg.Client#query`, whichever pool sends it, and the request's async context says which request
 * sent it. The session store's own statements are left out (the session's expiry is its to write).
 */
export interface RequestWrites {
  mayHaveWritten: boolean;
}

const requestWrites = new AsyncLocalStorage<RequestWrites>();
const inTransaction = new WeakSet<pg.Client>();
const OPENS = /^\s*(BEGIN|START TRANSACTION)\b/i;
const ENDS = /^\s*(COMMIT|END|ROLLBACK|ABORT)\b[\s;]*$/i;
const COMMITS = /^\s*(COMMIT|END)\b/i;
// The session with its person: read (and the expiry touched) before and after every request.
const SESSION = /\buser_sessions\b|\bauth_user_by_id\b/i;

let patched = false;
function watchClientQueries(): void {
  if (patched) return;
  patched = true;
  const original = pg.Client.prototype.query;
  pg.Client.prototype.query = function watchedQuery(this: pg.Client, ...args: unknown[]) {
    const writes = requestWrites.getStore();
    if (writes) {
      const first = args[0] as string | { text?: string } | undefined;
      const sql = typeof first === 'string' ? first : (first?.text ?? '');
      if (OPENS.test(sql)) inTransaction.add(this);
      else if (ENDS.test(sql)) {
        if (COMMITS.test(sql) && inTransaction.has(this)) {
          // Asked on the same connection just before the COMMIT, so its answer is in before the COMMIT's.
          const asked = (original as (sql: string) => Promise<pg.QueryResult<{ xid: string | null }>>).call(this, 'SELECT pg_current_xact_id_if_assigned()::text AS xid');
          asked.then((result) => {
            if (result.rows[0]?.xid !== null) writes.mayHaveWritten = true;
          }, () => (writes.mayHaveWritten = true));
        }
        inTransaction.delete(this);
      } else if (!inTransaction.has(this) && !SESSION.test(sql)) writes.mayHaveWritten = true;
    }
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
}

/**
 * The app as an HTTP handler that notes, per request, whether it may have written; `lastRequest()` answers for
 * the request served most recently (one at a time).
 */
export function watchingWrites(app: (req: IncomingMessage, res: ServerResponse) => void) {
  watchClientQueries();
  let last: RequestWrites = { mayHaveWritten: true };
  return {
    handler(req: IncomingMessage, res: ServerResponse) {
      last = { mayHaveWritten: false };
      requestWrites.run(last, () => app(req, res));
    },
    lastRequest: () => last,
  };
}
