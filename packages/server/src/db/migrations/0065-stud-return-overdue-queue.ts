import type { MigrationFn } from '../migrator';
import { createQueueSql, dropQueueSql } from '../job-queue-sql';

const QUEUE = 'stud-return-overdue';

/**
 * The job that tells both farms when a lent buck is a day past his return date; queued at hand-over for
 * the day after the last day of the loan. The owner creates the queue (the app role may not).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(createQueueSql(QUEUE, { retryLimit: 10, retryDelay: 30, expireInSeconds: 300 }, appRole));
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(dropQueueSql(QUEUE));
};
