import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import pg from 'pg';
import type { Config } from '../config/env';
import { logger } from '../lib/logger';
import { findIdentityById } from './passport';

export const SESSION_COOKIE = 'burrowline.sid';

/** Sessions in PostgreSQL; the cookie's maxAge rolls with activity (idle timeout). */
export function createSessionMiddleware(config: Config): { middleware: RequestHandler; pool: pg.Pool; store: session.Store } {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 4 });
  // An idle connection dropped by the database (a restart, a failover) must not crash the process:
  // the pool discards it and opens a new one on the next request.
  pool.on('error', (error) => logger.warn('session store connection lost', { error: error.message }));
  const store = new PgStore({ pool, tableName: 'user_sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
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
    const identity = await findIdentityById(userId);
    return Boolean(identity && !identity.disabled_at && identity.sessions_valid_after.getTime() <= createdAt);
  };
}
