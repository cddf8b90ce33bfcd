import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session from 'express-session';
import pg from 'pg';
import type { Config } from '../config/env';

export const SESSION_COOKIE = 'burrowline.sid';

/** Sessions in PostgreSQL; the cookie's maxAge rolls with activity (idle timeout). */
export function createSessionMiddleware(config: Config): { middleware: RequestHandler; pool: pg.Pool } {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 4 });
  const middleware = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store: new PgStore({ pool, tableName: 'user_sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
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
  return { middleware, pool };
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
