import type { MigrationFn } from '../migrator';

/** The tenant (co-op), farms, people, sessions, one-time tokens, the audit log and edit history. */
export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    CREATE TABLE cooperatives (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      slug text NOT NULL,
      currency char(3) NOT NULL DEFAULT 'USD',
      quarantine_days integer NOT NULL DEFAULT 30 CHECK (quarantine_days BETWEEN 0 AND 365),
      rules_text text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT cooperatives_slug_format CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$')
    );
    CREATE UNIQUE INDEX cooperatives_slug_unique ON cooperatives (slug);

    CREATE TABLE farms (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      name text NOT NULL,
      location text NOT NULL DEFAULT '',
      time_zone text NOT NULL DEFAULT 'America/Chicago',
      weight_unit text NOT NULL DEFAULT 'lb_oz' CHECK (weight_unit IN ('lb_oz', 'kg_g')),
      temperature_unit text NOT NULL DEFAULT 'F' CHECK (temperature_unit IN ('F', 'C')),
      breeds_kept text[] NOT NULL DEFAULT '{}',
      description text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz
    );
    CREATE UNIQUE INDEX farms_coop_name_unique ON farms (coop_id, lower(name)) WHERE deleted_at IS NULL;
    CREATE INDEX farms_coop_idx ON farms (coop_id);

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid REFERENCES farms(id),
      mentor_id uuid REFERENCES users(id),
      email text NOT NULL,
      name text NOT NULL,
      role text NOT NULL CHECK (role IN ('admin', 'member', 'apprentice')),
      password_hash text,
      disabled_at timestamptz,
      disabled_reason text,
      sessions_valid_after timestamptz NOT NULL DEFAULT 'epoch',
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT users_apprentice_has_mentor CHECK (role <> 'apprentice' OR mentor_id IS NOT NULL)
    );
    -- E-mail is unique across the platform: one person, one co-op.
    CREATE UNIQUE INDEX users_email_unique ON users (lower(email));
    CREATE INDEX users_coop_idx ON users (coop_id);
    CREATE INDEX users_farm_idx ON users (farm_id);

    -- connect-pg-simple's table (its own shape), outside row-level security.
    CREATE TABLE user_sessions (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX user_sessions_expire_idx ON user_sessions (expire);

    CREATE TABLE one_time_tokens (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      purpose text NOT NULL CHECK (purpose IN ('set_password', 'reset_password')),
      token_hash text NOT NULL,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX one_time_tokens_hash_unique ON one_time_tokens (token_hash);

    CREATE TABLE audit_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid REFERENCES cooperatives(id),
      actor_user_id uuid REFERENCES users(id),
      action text NOT NULL,
      subject_type text,
      subject_id uuid,
      details jsonb NOT NULL DEFAULT '{}',
      ip text,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_events_coop_created_idx ON audit_events (coop_id, created_at DESC);

    -- Who changed what on records others refer to: old → new per field.
    CREATE TABLE record_changes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      table_name text NOT NULL,
      record_id uuid NOT NULL,
      actor_user_id uuid REFERENCES users(id),
      changes jsonb NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX record_changes_record_idx ON record_changes (table_name, record_id, created_at);
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TABLE IF EXISTS record_changes, audit_events, one_time_tokens, user_sessions, users, farms, cooperatives CASCADE;
  `);
};
