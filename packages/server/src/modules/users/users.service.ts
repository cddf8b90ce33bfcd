import type { Transaction } from 'sequelize';
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

/** Sets a new password hash and ends every session that began before now. */
export async function replacePassword(user: User, passwordHash: string, tx: Transaction): Promise<void> {
  user.passwordHash = passwordHash;
  user.sessionsValidAfter = new Date();
  await user.save({ transaction: tx });
}
