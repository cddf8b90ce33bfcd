import argon2 from 'argon2';
import type { TestProject } from 'vitest/node';

export const TEST_PASSWORD = 'correct-horse-hutch-9';

declare module 'vitest' {
  export interface ProvidedContext {
    passwordHash: string;
  }
}

/**
 * The cheapest Argon2id there is (8 KiB, one pass, one lane) for the shared test password: thousands of
 * sign-ins then cost microseconds instead of a quarter second each. The parameters travel inside the hash,
 * so the app verifies it unchanged; passwords the app itself sets (invitations, resets) still get its real
 * parameters, and lib/passwords.test.ts holds those.
 */
export const CHEAPEST_ARGON2ID = { type: argon2.argon2id, memoryCost: 8, timeCost: 1, parallelism: 1 } as const;

export default async function setup(project: TestProject) {
  project.provide('passwordHash', await argon2.hash(TEST_PASSWORD, CHEAPEST_ARGON2ID));
}
