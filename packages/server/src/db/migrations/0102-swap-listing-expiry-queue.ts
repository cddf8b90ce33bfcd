import type { MigrationFn } from '../migrator';

const BOSS_SCHEMA = 'pgboss';
const QUEUE = 'swap-listing-expiry';

/**
 * The job that closes a listing the day after its last valid day (queued when it is published). The
 * owner creates the queue (the app role may not).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    SELECT ${BOSS_SCHEMA}.create_queue('${QUEUE}', '{"policy":"standard","retryLimit":10,"retryDelay":30,"retryBackoff":true,"expireInSeconds":300}'::json)
    WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${QUEUE}');
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DELETE FROM ${BOSS_SCHEMA}.job WHERE name = '${QUEUE}';
    DELETE FROM ${BOSS_SCHEMA}.archive WHERE name = '${QUEUE}';
    SELECT ${BOSS_SCHEMA}.delete_queue('${QUEUE}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${QUEUE}');
  `);
};
