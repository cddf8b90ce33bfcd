import { col, fn, Op, QueryTypes, where, type Transaction } from 'sequelize';
import { database } from '../../db/sequelize';
import type { Role } from '@burrowline/shared';
import { User } from './user.model';

export interface NewUser {
  coopId: string;
  farmId: string | null;
  mentorId?: string | null;
  email: string;
  name: string;
  role: Role;
  passwordHash?: string | null;
}

/** Adds a person to a co-op inside the caller's tenant transaction. */
export async function createUser(input: NewUser, tx: Transaction): Promise<User> {
  return User.create({ ...input, email: input.email.trim().toLowerCase() }, { transaction: tx });
}

export async function findUser(userId: string, tx: Transaction, opts: { lock?: boolean } = {}): Promise<User | null> {
  return User.findByPk(userId, { transaction: tx, lock: opts.lock ? tx.LOCK.UPDATE : undefined });
}

/**
 * The mentor of the person who wrote an entry: named on every review, since only an apprentice's own mentor
 * reviews her work. Null for anyone who is not an apprentice (or no one).
 */
export async function mentorIdOf(authorId: string | null, tx: Transaction): Promise<string | null> {
  if (!authorId) return null;
  const user = await User.findByPk(authorId, { attributes: ['id', 'mentorId'], transaction: tx });
  return user?.mentorId ?? null;
}

/** Sets a new password hash and ends every session that began before now. */
export async function replacePassword(user: User, passwordHash: string, tx: Transaction): Promise<void> {
  user.passwordHash = passwordHash;
  user.sessionsValidAfter = new Date();
  await user.save({ transaction: tx });
}

/**
 * Whether an e-mail already belongs to an account anywhere on the platform (e-mail is unique across
 * co-ops). Runs before the tenant is known, through the identity look-up outside row-level security.
 */
export async function isEmailRegistered(email: string, tx?: Transaction): Promise<boolean> {
  const rows = await database().query('SELECT id FROM auth_user_by_email($1)', { bind: [email], type: QueryTypes.SELECT, transaction: tx });
  return rows.length > 0;
}

/**
 * A person as an answer would show them, never saved: lets an answer about an address with an account
 * elsewhere look exactly like one about a new address.
 */
export function unsavedUser(input: NewUser): User {
  return User.build({
    mentorId: null,
    disabledAt: null,
    disabledReason: null,
    version: 0,
    ...input,
    email: input.email.trim().toLowerCase(),
    createdAt: new Date(),
  });
}

/** Someone of the actor's co-op by e-mail, inside the tenant transaction. */
export async function findUserByEmail(email: string, tx: Transaction): Promise<User | null> {
  return User.findOne({ where: where(fn('lower', col('email')), email.trim().toLowerCase()), transaction: tx });
}

/** People of the co-op by id, in the order given (a page of the roster). */
export async function usersInOrder(coopId: string, ids: string[], tx: Transaction): Promise<User[]> {
  if (ids.length === 0) return [];
  const users = new Map((await User.findAll({ where: { coopId, id: { [Op.in]: ids } }, transaction: tx })).map((u) => [u.id, u]));
  return ids.map((id) => users.get(id)).filter((u): u is User => Boolean(u));
}

/** The co-op's members and admins who belong to a farm and can sign in (not apprentices, not disabled, not invitees). */
export async function activeFarmMembers(coopId: string, tx: Transaction): Promise<User[]> {
  return User.findAll({
    where: { coopId, role: { [Op.ne]: 'apprentice' }, disabledAt: null, farmId: { [Op.ne]: null }, passwordHash: { [Op.ne]: null } },
    order: [['name', 'ASC'], ['id', 'ASC']],
    transaction: tx,
  });
}

/** Names by id, for presenting who did what. */
export async function namesOf(userIds: (string | null | undefined)[], tx: Transaction): Promise<Map<string, string>> {
  const ids = [...new Set(userIds.filter((id): id is string => Boolean(id)))];
  if (ids.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'name'], transaction: tx });
  return new Map(users.map((u) => [u.id, u.name]));
}

/** The admins who can act on mail today: enabled and with a password set. */
export async function listAdminContacts(coopId: string, tx: Transaction): Promise<{ id: string; email: string; name: string }[]> {
  const admins = await User.findAll({
    where: { coopId, role: 'admin', disabledAt: { [Op.is]: null }, passwordHash: { [Op.not]: null } },
    attributes: ['id', 'email', 'name'],
    transaction: tx,
  });
  return admins.map((a) => ({ id: a.id, email: a.email, name: a.name }));
}

/**
 * Changes a role and ends every session that began before now, so the person's next request and
 * socket carry the new permissions. An apprentice who becomes a member keeps the mentor's farm and
 * leaves the mentor.
 */
export async function setRole(user: User, role: Role, tx: Transaction): Promise<void> {
  user.role = role;
  if (role !== 'apprentice') user.mentorId = null;
  user.sessionsValidAfter = new Date();
  await user.save({ transaction: tx });
}

/** Turns an account off: it cannot sign in, and every session it has ends at once (ASVS 7.4.2). */
export async function disableUser(user: User, reason: string, tx: Transaction): Promise<void> {
  const now = new Date();
  user.disabledAt = now;
  user.disabledReason = reason;
  user.sessionsValidAfter = now;
  await user.save({ transaction: tx });
}

export async function enableUser(user: User, tx: Transaction): Promise<void> {
  user.disabledAt = null;
  user.disabledReason = null;
  await user.save({ transaction: tx });
}

/** Attaches a person to a farm (an accepted invitation). */
export async function attachToFarm(user: User, farmId: string, tx: Transaction): Promise<void> {
  user.farmId = farmId;
  await user.save({ transaction: tx });
}

/** A revoked invitee invited again: the same account, renamed and given the new role, turned back on. */
export async function reviveInvitee(user: User, input: { name: string; role: Role }, tx: Transaction): Promise<void> {
  user.set({ name: input.name, role: input.role, mentorId: null, farmId: null, disabledAt: null, disabledReason: null });
  await user.save({ transaction: tx });
}

/** The account record as other modules handle it (they reach it through this service, not the model). */
export type UserRecord = User;
