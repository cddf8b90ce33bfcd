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
