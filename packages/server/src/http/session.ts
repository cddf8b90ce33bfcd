import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import pg from 'pg';
import type { Config } from '../config/env';
import { logger } from '../lib/logger';
import { findIdentityById, forgetIdentityOfSession, keepIdentityOfSession, takeIdentityOfSession, type IdentityRow } from './passport';

export const SESSION_COOKIE = 'burrowline.sid';

/** A session's stored expiry is written again only once this share of the idle window has passed. */
export const SESSION_TOUCH_SHARE = 0.1;

/** Most sessions whose stored expiry a store remembers (the oldest is dropped first). */
const REMEMBERED_SESSIONS = 10_000;

function remember<V>(map: Map<string, V>, key: string, value: V): void {
  if (map.size >= REMEMBERED_SESSIONS) map.delete(map.keys().next().value!);
  map.set(key, value);
}

type SessionRow = { sess: session.SessionData | string; expire_ms: number } & { [K in keyof IdentityRow]: IdentityRow[K] | null };

/**
 * connect-pg-simple, leaner per request: one statement reads the session and its person (through the
 * SECURITY DEFINER look-up, so a disabled account or a new role counts at once), and the stored expiry
 * is moved on only once a good part of the idle window has passed instead of on every request. The
 * idle timeout so ends between 90 % and 100 % of the window after the last request, never later.
 */
function leanStore(PgStore: typeof connectPgSimple.PGStore, pool: pg.Pool, idleSeconds: number) {
  const touchAfterMs = idleSeconds * 1000 * SESSION_TOUCH_SHARE;
  return class LeanPgStore extends PgStore {
    /** The latest expiry this instance read or wrote for each session (a stored expiry only ever moves on). */
    private readonly storedExpiry = new Map<string, number>();

    override get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void {
      pool
        .query<SessionRow>({
          // Named, so each connection plans it once: every request sends it.
          name: 'session-with-person',
          // With the person, the version of their co-op's breeds and farms (db/coop-directory.ts).
          text: `SELECT s.sess, extract(epoch FROM s.expire::timestamptz)::float8 * 1000 AS expire_ms, u.*,
               CASE WHEN u.id IS NOT NULL THEN coop_directory_version(u.coop_id) END AS directory_version
             FROM user_sessions s
             LEFT JOIN LATERAL auth_user_by_id(
               CASE WHEN s.sess->'passport'->>'user' ~* '^[0-9a-f-]{36}$' THEN (s.sess->'passport'->>'user')::uuid END
             ) u ON true
            WHERE s.sid = $1 AND s.expire >= to_timestamp($2)`,
          values: [sid, Math.ceil(Date.now() / 1000)],
        })
        .then(({ rows: [row] }) => {
          if (!row) return callback(null, null);
          // What this instance wrote meanwhile may be later than what an overlapping request read: keep the later.
          remember(this.storedExpiry, sid, Math.max(row.expire_ms, this.storedExpiry.get(sid) ?? 0));
          if (row.id) keepIdentityOfSession(sid, row as IdentityRow);
          callback(null, typeof row.sess === 'string' ? (JSON.parse(row.sess) as session.SessionData) : row.sess);
        }, callback);
    }

    override touch(sid: string, sess: session.SessionData, callback?: (err?: unknown) => void): void {
      // Kept after the request (not taken): requests of one session that overlap then write the expiry
      // once between them, not once each.
      const stored = this.storedExpiry.get(sid);
      const next = sess.cookie?.expires ? new Date(sess.cookie.expires).getTime() : Number.NaN;
      if (stored !== undefined && next - stored < touchAfterMs) return callback?.();
      // Counted as written from now on, so a request of the session ending meanwhile does not write it again.
      if (Number.isFinite(next)) remember(this.storedExpiry, sid, next);
      super.touch(sid, sess, (error?: unknown) => {
        if (error) this.storedExpiry.delete(sid);
        callback?.(error);
      });
    }

    override set(sid: string, sess: session.SessionData, callback?: (err?: unknown) => void): void {
      this.storedExpiry.delete(sid);
      super.set(sid, sess, callback);
    }

    override destroy(sid: string, callback?: (err?: unknown) => void): void {
      this.storedExpiry.delete(sid);
      forgetIdentityOfSession(sid);
      super.destroy(sid, callback);
    }
  };
}

/** Sessions in PostgreSQL; the cookie's maxAge rolls with activity (idle timeout). */
export function createSessionMiddleware(config: Config): { middleware: RequestHandler; pool: pg.Pool; store: session.Store } {
  const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 4 });
  // An idle connection dropped by the database (a restart, a failover) must not crash the process:
  // the pool discards it and opens a new one on the next request.
  pool.on('error', (error) => logger.warn('session store connection lost', { error: error.message }));
  const LeanPgStore = leanStore(connectPgSimple(session), pool, config.sessionIdleSeconds);
  const store = new LeanPgStore({ pool, tableName: 'user_sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: config.trustProxyHops > 0,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.env === 'production',
      maxAge: config.sessionIdleSeconds * 1000,
    },
  });
  return { middleware, pool, store };
}

/** express-session has no absolute lifetime: a session older than the limit starts over empty (ASVS 7.3.2). */
export function enforceAbsoluteLifetime(config: Config): RequestHandler {
  return (req, _res, next) => {
    const createdAt = req.session?.createdAt;
    if (createdAt && Date.now() - createdAt > config.sessionAbsoluteSeconds * 1000) {
      forgetIdentityOfSession(req.sessionID);
      return req.session.regenerate((err) => next(err));
    }
    next();
  };
}

/**
 * Whether a session may still carry a live socket: it exists (not expired), is signed in, is within
 * its absolute lifetime, and its person is enabled with no later revocation.
 */
export function sessionChecker(store: session.Store, config: Config): (sessionId: string) => Promise<boolean> {
  return async (sessionId) => {
    const data = await new Promise<(session.SessionData & { passport?: { user?: string } }) | null>((resolve) =>
      store.get(sessionId, (error, value) => resolve(error ? null : ((value as never) ?? null))),
    );
    const userId = data?.passport?.user;
    const createdAt = data?.createdAt ?? 0;
    if (!userId || Date.now() - createdAt > config.sessionAbsoluteSeconds * 1000) return false;
    const identity = takeIdentityOfSession(sessionId, userId) ?? (await findIdentityById(userId));
    return Boolean(identity && !identity.disabled_at && identity.sessions_valid_after.getTime() <= createdAt);
  };
}
