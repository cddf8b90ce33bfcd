import type { MigrationFn } from '../migrator';

/**
 * Direct invitations by the admin. The person's account exists from the invitation on (without a
 * password, so nobody can sign in with it); their farm is created, or the chosen farm joined, when
 * they set their password. Never deleted: a revoked invitation stays on record.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      user_id uuid NOT NULL REFERENCES users(id),
      invited_by_user_id uuid NOT NULL REFERENCES users(id),
      status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'accepted', 'revoked')),
      -- Either an existing farm to join, or the profile of the farm to create on acceptance.
      farm_id uuid REFERENCES farms(id),
      new_farm_name text,
      new_farm_location text,
      new_farm_time_zone text,
      new_farm_breeds text[],
      accepted_at timestamptz,
      revoked_at timestamptz,
      revoked_by_user_id uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT invitations_farm_given CHECK (farm_id IS NOT NULL OR (new_farm_name IS NOT NULL AND new_farm_location IS NOT NULL AND new_farm_time_zone IS NOT NULL)),
      CONSTRAINT invitations_accepted_has_farm CHECK (status <> 'accepted' OR (accepted_at IS NOT NULL AND farm_id IS NOT NULL)),
      CONSTRAINT invitations_revoked_when CHECK (status <> 'revoked' OR revoked_at IS NOT NULL)
    );
    CREATE UNIQUE INDEX invitations_pending_user_unique ON invitations (user_id) WHERE status = 'pending';
    CREATE INDEX invitations_coop_idx ON invitations (coop_id, status);

    ALTER TABLE invitations ENABLE ROW LEVEL SECURITY;
    ALTER TABLE invitations FORCE ROW LEVEL SECURITY;
    CREATE POLICY invitations_tenant ON invitations USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT, UPDATE ON invitations TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS invitations`);
};
