import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * The notification centre: one row per person told, unique per (person, key) so a retried request or a
 * re-run job never tells anyone twice; what was decided about e-mail is kept with the row, and the morning
 * e-mail marks the ones it carried. Preferences hold only a person's departures from each kind's default.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE notifications (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      user_id uuid NOT NULL REFERENCES users(id),
      kind text NOT NULL CHECK (length(kind) BETWEEN 1 AND 60),
      title text NOT NULL CHECK (length(title) BETWEEN 1 AND 300),
      body text CHECK (length(body) <= 2000),
      link text NOT NULL CHECK (link LIKE '/%' AND length(link) <= 500),
      key text NOT NULL CHECK (length(key) BETWEEN 1 AND 300),
      delivery text NOT NULL CHECK (delivery IN ('immediately', 'digest', 'never')),
      mail_subject text,
      mail_text text,
      digested_at timestamptz,
      read_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX notifications_once_per_key ON notifications (user_id, key);
    CREATE INDEX notifications_inbox ON notifications (user_id, created_at DESC, id DESC);
    CREATE INDEX notifications_unread ON notifications (user_id) WHERE read_at IS NULL;
    CREATE INDEX notifications_for_digest ON notifications (user_id) WHERE delivery = 'digest' AND digested_at IS NULL AND mail_text IS NOT NULL;
    ${tenantIsolation('notifications')}
    GRANT SELECT, INSERT, UPDATE ON notifications TO ${appRole};

    CREATE TABLE notification_preferences (
      user_id uuid NOT NULL REFERENCES users(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      kind text NOT NULL CHECK (length(kind) BETWEEN 1 AND 60),
      delivery text NOT NULL CHECK (delivery IN ('immediately', 'digest', 'never')),
      updated_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, kind)
    );
    ${tenantIsolation('notification_preferences')}
    GRANT SELECT, INSERT, UPDATE, DELETE ON notification_preferences TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS notification_preferences; DROP TABLE IF EXISTS notifications;');
};
