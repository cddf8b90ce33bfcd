import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { QueryTypes } from 'sequelize';
import { database } from '../db/sequelize';
import type { Role } from '@burrowline/shared';
import { verifyPassword } from '../lib/passwords';
import type { SessionUser } from '../lib/session-user';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    createdAt: number;
  }
}

export interface IdentityRow {
  id: string;
  coop_id: string;
  farm_id: string | null;
  mentor_id: string | null;
  email: string;
  name: string;
  role: Role;
  disabled_at: Date | null;
  sessions_valid_after: Date;
  /** Read with the session only (see session.ts). */
  directory_version?: string | null;
}

/** Identity look-ups run before the tenant is known: SECURITY DEFINER functions (see migration 0002). */
export async function findIdentityByEmail(email: string) {
  const [row] = await database().query<{ id: string; coop_id: string; password_hash: string | null; disabled_at: Date | null }>(
    'SELECT * FROM auth_user_by_email($1)',
    { bind: [email], type: QueryTypes.SELECT },
  );
  return row ?? null;
}

/**
 * The person read together with the session (one statement per request, see the session store), handed
 * to the deserializer of the same request by session id. A miss (two requests of one session at once)
 * reads the person again.
 */
const identitiesReadWithSession = new Map<string, IdentityRow>();
const REMEMBERED_IDENTITIES = 10_000;

export function keepIdentityOfSession(sessionId: string, row: IdentityRow): void {
  if (identitiesReadWithSession.size >= REMEMBERED_IDENTITIES) identitiesReadWithSession.delete(identitiesReadWithSession.keys().next().value!);
  identitiesReadWithSession.set(sessionId, row);
}

export function takeIdentityOfSession(sessionId: string, userId: string): IdentityRow | null {
  const row = identitiesReadWithSession.get(sessionId);
  identitiesReadWithSession.delete(sessionId);
  return row?.id === userId ? row : null;
}

export function forgetIdentityOfSession(sessionId: string): void {
  identitiesReadWithSession.delete(sessionId);
}

export async function findIdentityById(id: string): Promise<IdentityRow | null> {
  const [row] = await database().query<IdentityRow>('SELECT * FROM auth_user_by_id($1)', { bind: [id], type: QueryTypes.SELECT });
  return row ?? null;
}

export function configurePassport(): passport.PassportStatic {
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
      try {
        const identity = await findIdentityByEmail(email);
        const valid = await verifyPassword(identity?.password_hash ?? null, password);
        if (!identity || !valid || identity.disabled_at) return done(null, false);
        const full = await findIdentityById(identity.id);
        return done(null, full ? toSessionUser(full) : false);
      } catch (error) {
        return done(error);
      }
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser(async (req: import('express').Request, id: string, done: (err: unknown, user?: SessionUser | false) => void) => {
    try {
      const row = takeIdentityOfSession(req.sessionID, id) ?? (await findIdentityById(id));
      const createdAt = req.session?.createdAt ?? 0;
      // A disabled account, or sessions revoked after this one began, end here (ASVS 7.4.2).
      if (!row || row.disabled_at || row.sessions_valid_after.getTime() > createdAt) return done(null, false);
      return done(null, toSessionUser(row));
    } catch (error) {
      return done(error);
    }
  });
  return passport;
}

function toSessionUser(row: IdentityRow): SessionUser {
  return {
    id: row.id,
    coopId: row.coop_id,
    farmId: row.farm_id,
    mentorId: row.mentor_id,
    email: row.email,
    name: row.name,
    role: row.role,
    ...(row.directory_version ? { directoryVersion: row.directory_version } : {}),
  };
}
