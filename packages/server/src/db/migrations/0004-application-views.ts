import type { MigrationFn } from '../migrator';

/** Which admin has opened which application: the queue's "new" marks and the unread badge. */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE application_views (
      application_id uuid NOT NULL REFERENCES applications(id),
      user_id uuid NOT NULL REFERENCES users(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      viewed_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (application_id, user_id)
    );
    CREATE INDEX application_views_user_idx ON application_views (user_id);

    ALTER TABLE application_views ENABLE ROW LEVEL SECURITY;
    ALTER TABLE application_views FORCE ROW LEVEL SECURITY;
    CREATE POLICY application_views_tenant ON application_views USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT ON application_views TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS application_views`);
};
