import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

const BOSS_SCHEMA = 'pgboss';
const REMINDER_QUEUE = 'ledger-dues-reminders';

/**
 * The co-op's yearly dues: the amount each farm owes and the date it is due. Each farm's charge is a
 * transfer of the Ledger; the reminder before the due date is a job of its own queue (created here by the
 * owner, as the app role may not), and each farm's e-mail is keyed by period and farm so it goes once.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE dues_periods (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      year integer NOT NULL CHECK (year BETWEEN 2000 AND 2100),
      amount_cents bigint NOT NULL CHECK (amount_cents > 0),
      due_on date NOT NULL,
      reminder_days_before integer NOT NULL DEFAULT 14 CHECK (reminder_days_before BETWEEN 0 AND 90),
      set_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX dues_periods_one_per_year ON dues_periods (coop_id, year);
    ${tenantIsolation('dues_periods')}
    GRANT SELECT, INSERT, UPDATE ON dues_periods TO ${appRole};
  `);
  await sql(`
    SELECT ${BOSS_SCHEMA}.create_queue('${REMINDER_QUEUE}', '{"policy":"standard","retryLimit":8,"retryDelay":30,"retryBackoff":true}'::json)
    WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${REMINDER_QUEUE}');
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DELETE FROM ${BOSS_SCHEMA}.job WHERE name = '${REMINDER_QUEUE}';
    DELETE FROM ${BOSS_SCHEMA}.archive WHERE name = '${REMINDER_QUEUE}';
    SELECT ${BOSS_SCHEMA}.delete_queue('${REMINDER_QUEUE}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${REMINDER_QUEUE}');
    DROP TABLE IF EXISTS dues_periods;
  `);
};
