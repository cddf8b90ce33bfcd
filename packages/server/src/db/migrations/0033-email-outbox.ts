import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

const BOSS_SCHEMA = 'pgboss';
const MAIL_QUEUE = 'mail-outbox';

/**
 * Every e-mail is first a row here, written in the transaction of the change it tells about, so a
 * crash after commit or a dead mail server loses nothing. The key names the event (unique per co-op),
 * so a repeated request or job queues the e-mail once; `sent_at` is set as soon as the mail server
 * accepts it, so a retry never sends it again. A tenant table like the others: the worker reads a row
 * inside its co-op's transaction (the job carries only the row's id and co-op).
 *
 * The job queue that drains it is pg-boss's (schema of 0019), with its own queue created here by the
 * owner because the app role may not create the queue's table: 16 tries with doubling back-off from
 * 5 seconds cover a mail server that is down for about five days.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE email_outbox (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      idempotency_key text NOT NULL,
      recipient text NOT NULL,
      subject text NOT NULL,
      -- The body may carry a single-use link: it is cleared once the mail server has accepted it.
      text_body text,
      html_body text,
      message_id text NOT NULL,
      attempts integer NOT NULL DEFAULT 0,
      last_error text,
      created_at timestamptz NOT NULL DEFAULT now(),
      sent_at timestamptz
    );
    CREATE UNIQUE INDEX email_outbox_once ON email_outbox (coop_id, idempotency_key);
    ${tenantIsolation('email_outbox')}
    GRANT SELECT, INSERT, UPDATE ON email_outbox TO ${appRole};
  `);
  await sql(`
    SELECT ${BOSS_SCHEMA}.create_queue('${MAIL_QUEUE}', '{"policy":"standard","retryLimit":16,"retryDelay":5,"retryBackoff":true,"expireInSeconds":300}'::json)
    WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${MAIL_QUEUE}');
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  // The queue's table refers to the queue row, so its jobs go first.
  await sql(`
    DELETE FROM ${BOSS_SCHEMA}.job WHERE name = '${MAIL_QUEUE}';
    DELETE FROM ${BOSS_SCHEMA}.archive WHERE name = '${MAIL_QUEUE}';
    SELECT ${BOSS_SCHEMA}.delete_queue('${MAIL_QUEUE}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${MAIL_QUEUE}');
    DROP TABLE IF EXISTS email_outbox;
  `);
};
