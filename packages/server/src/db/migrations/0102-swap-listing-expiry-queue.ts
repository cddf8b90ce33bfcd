import type { MigrationFn } from '../migrator';
import { createQueueSql, dropQueueSql } from '../job-queue-sql';

const QUEUE = 'swap-listing-expiry';

/**
 * The job that closes a listing the day after its last valid day (queued when it is published). The
 * owner creates the queue (the app role may not).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(createQueueSql(QUEUE, { retryLimit: 10, retryDelay: 30, expireInSeconds: 300 }, appRole));
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(dropQueueSql(QUEUE));
};
