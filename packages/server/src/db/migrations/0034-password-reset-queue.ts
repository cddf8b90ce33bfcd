import type { MigrationFn } from '../migrator';
import { createQueueSql, dropQueueSql } from '../job-queue-sql';

const QUEUE = 'password-reset-requests';

/**
 * A password-reset request is answered at once and done by a job, so the answer takes the same time
 * whether or not the address has an account. The owner creates the queue (the app role may not); a
 * few quick retries cover a passing database error, after which the person can simply ask again.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(createQueueSql(QUEUE, { retryLimit: 5, retryDelay: 5, expireInSeconds: 120 }, appRole));
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(dropQueueSql(QUEUE));
};
