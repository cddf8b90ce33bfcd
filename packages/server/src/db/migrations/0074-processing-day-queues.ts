import type { MigrationFn } from '../migrator';

const BOSS_SCHEMA = 'pgboss';
const QUEUES = ['processing-day-offers', 'processing-day-reminders'];

/** Job queues of processing days: an offered place that lapses, reminders before the deadline and the day (the app role may not create queues). */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  for (const queue of QUEUES) {
    await sql(`
      SELECT ${BOSS_SCHEMA}.create_queue('${queue}', '{"policy":"standard","retryLimit":8,"retryDelay":30,"retryBackoff":true}'::json)
      WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${queue}');
    `);
  }
  await sql(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};`);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  for (const queue of QUEUES) {
    await sql(`
      DELETE FROM ${BOSS_SCHEMA}.job WHERE name = '${queue}';
      DELETE FROM ${BOSS_SCHEMA}.archive WHERE name = '${queue}';
      SELECT ${BOSS_SCHEMA}.delete_queue('${queue}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${queue}');
    `);
  }
};
