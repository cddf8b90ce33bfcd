import type { TestProject } from 'vitest/node';
import { hashPassword } from '../../packages/server/src/lib/passwords';

export const TEST_PASSWORD = 'correct-horse-hutch-9';

declare module 'vitest' {
  export interface ProvidedContext {
    passwordHash: string;
  }
}

/** Argon2 is slow on purpose: hash the shared test password once per run. */
export default async function setup(project: TestProject) {
  project.provide('passwordHash', await hashPassword(TEST_PASSWORD));
}
