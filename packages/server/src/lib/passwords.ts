import argon2 from 'argon2';
import { dictionary } from '@zxcvbn-ts/language-common';
import { ErrorCode } from '@burrowline/shared';
import { AppError } from './app-error';

const common = new Set<string>((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));

/** ASVS 6.2.4: refuse the passwords attackers try first. */
export function assertPasswordAllowed(password: string, context: string[] = []): void {
  const lowered = password.toLowerCase();
  const echoesContext = context.some((c) => c.length >= 4 && lowered.includes(c.toLowerCase()));
  if (common.has(lowered) || echoesContext) {
    throw new AppError(ErrorCode.weakPassword, 400, 'Choose a less common password', {
      password: ['This password is too common or too close to your e-mail; choose another'],
    });
  }
}

/** Argon2id with the library's defaults (m = 64 MiB, t = 3). */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export async function verifyPassword(hash: string | null, password: string): Promise<boolean> {
  if (!hash) {
    // Same work for a missing account as for a wrong password, so timing does not tell them apart.
    await argon2.hash(password, { type: argon2.argon2id });
    return false;
  }
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}
