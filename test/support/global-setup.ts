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

let stopMailWorker: (() => Promise<void>) | null = null;
let projectsUsingWorker = 0;

/**
 * One outbox worker for the whole run, in vitest's own process, which lives until every file is done.
 * Test processes start none (MAIL_WORKER=false in the projects' env): a worker in a process that ends
 * with its file could take a job and die before sending it, and the mail would then wait for pg-boss to
 * expire the job, long after the test gave up.
 */
async function startRunMailWorker() {
  const { loadConfig } = await import('../../packages/server/src/config/env');
  const { connectDatabase } = await import('../../packages/server/src/composition/database');
  const { configureMailer } = await import('../../packages/server/src/lib/mailer');
  const { configureMailOutbox, startMailWorker } = await import('../../packages/server/src/lib/mail-outbox');
  // The job handlers (password reset, …) register themselves when their module loads.
  await import('../../packages/server/src/app');
  const config = loadConfig({ ...process.env, MAIL_WORKER: 'true' });
  connectDatabase(config.databaseUrl, config.databasePoolMax);
  configureMailer(config.smtp);
  configureMailOutbox({ retryDelaySeconds: config.mail.retryDelaySeconds });
  return startMailWorker({ connectionString: config.databaseUrl, pollingIntervalSeconds: 0.5 });
}

export default async function setup(project: TestProject) {
  project.provide('passwordHash', await argon2.hash(TEST_PASSWORD, CHEAPEST_ARGON2ID));
  projectsUsingWorker += 1;
  stopMailWorker ??= await startRunMailWorker();
  return async () => {
    projectsUsingWorker -= 1;
    if (projectsUsingWorker > 0 || !stopMailWorker) return;
    const stop = stopMailWorker;
    stopMailWorker = null;
    await stop();
  };
}
