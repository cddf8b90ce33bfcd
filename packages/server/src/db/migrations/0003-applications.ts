import type { MigrationFn } from '../migrator';

/**
 * Applications to join a co-op, from its public form. Never deleted: a decision (who, when, why)
 * stays on the record. One pending application per e-mail per co-op; a repeated submit with the same
 * idempotency key finds the first one.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE applications (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      idempotency_key uuid NOT NULL,
      status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'approved', 'rejected', 'withdrawn')),
      applicant_name text NOT NULL,
      email text NOT NULL,
      phone text NOT NULL DEFAULT '',
      farm_name text NOT NULL,
      location text NOT NULL,
      time_zone text NOT NULL,
      breeds_kept text[] NOT NULL DEFAULT '{}',
      does integer NOT NULL CHECK (does >= 0),
      bucks integer NOT NULL CHECK (bucks >= 0),
      quarantine_practice text NOT NULL,
      disease_last_year boolean NOT NULL,
      disease_details text NOT NULL DEFAULT '',
      sharing text[] NOT NULL DEFAULT '{}',
      sharing_notes text NOT NULL DEFAULT '',
      -- The rules as they read when the applicant agreed to them.
      rules_text_agreed text NOT NULL,
      rules_agreed_at timestamptz NOT NULL,
      reviewed_by_user_id uuid REFERENCES users(id),
      reviewed_at timestamptz,
      decision_note text,
      user_id uuid REFERENCES users(id),
      farm_id uuid REFERENCES farms(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT applications_decided_when CHECK (status = 'pending' OR (reviewed_at IS NOT NULL AND reviewed_by_user_id IS NOT NULL)),
      CONSTRAINT applications_approved_links CHECK (status <> 'approved' OR (user_id IS NOT NULL AND farm_id IS NOT NULL)),
      CONSTRAINT applications_rejected_reason CHECK (status <> 'rejected' OR decision_note IS NOT NULL)
    );
    CREATE UNIQUE INDEX applications_idempotency_unique ON applications (coop_id, idempotency_key);
    CREATE UNIQUE INDEX applications_pending_email_unique ON applications (coop_id, lower(email)) WHERE status = 'pending';
    CREATE INDEX applications_queue_idx ON applications (coop_id, status, created_at DESC);

    ALTER TABLE applications ENABLE ROW LEVEL SECURITY;
    ALTER TABLE applications FORCE ROW LEVEL SECURITY;
    CREATE POLICY applications_tenant ON applications USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT, UPDATE ON applications TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS applications`);
};
