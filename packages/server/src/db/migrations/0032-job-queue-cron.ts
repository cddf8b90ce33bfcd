import type { MigrationFn } from '../migrator';

const BOSS_SCHEMA = 'pgboss';
/** pg-boss's own queue through which its cron hands each due schedule to the named queue. */
const CRON_HAND_OFF_QUEUE = '__pgboss__send-it';

/**
 * The job queue's cron needs its hand-off queue. pg-boss creates it on start, but the app role may not
 * create tables (only the owner migrates), so without this the quarter-hour schedule of the morning
 * e-mail was registered yet never fired. Created here by the owner, like the digest queue in 0019.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    SELECT ${BOSS_SCHEMA}.create_queue('${CRON_HAND_OFF_QUEUE}', '{"policy":"standard"}'::json)
    WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${CRON_HAND_OFF_QUEUE}');
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`SELECT ${BOSS_SCHEMA}.delete_queue('${CRON_HAND_OFF_QUEUE}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${CRON_HAND_OFF_QUEUE}')`);
};
