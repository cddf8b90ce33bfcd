import type { MigrationFn } from '../migrator';
import { createQueueSql, dropQueueSql } from '../job-queue-sql';

const QUEUES = ['processing-day-offers', 'processing-day-reminders'];

/** Job queues of processing days: an offered place that lapses, reminders before the deadline and the day (the app role may not create queues). */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  for (const queue of QUEUES) await sql(createQueueSql(queue, { retryLimit: 8, retryDelay: 30 }, appRole));
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  for (const queue of QUEUES) await sql(dropQueueSql(queue));
};
