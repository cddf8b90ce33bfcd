import type { MigrationFn } from '../migrator';

const BOSS_SCHEMA = 'pgboss';
const QUEUE = 'password-reset-requests';

/**
 * A password-reset request is answered at once and done by a job, so the answer takes the same time
 * whether or not the address has an account. The owner creates the queue (the app role may not); a
 * few quick retries cover a passing database error, after which the person can simply ask again.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    SELECT ${BOSS_SCHEMA}.create_queue('${QUEUE}', '{"policy":"standard","retryLimit":5,"retryDelay":5,"retryBackoff":true,"expireInSeconds":120}'::json)
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
