import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Mentorship: the co-op's settings (its list of chore kinds, whether a dangerous station needs a sign-off),
 * its skills checklist, the apprentice's chore entries (reviewed like weigh-ins: pending → accepted or
 * returned; a returned entry is corrected and sent again), and the skill history (each sign-off,
 * "practising" and withdrawal kept; the latest is the skill's state). Figures a chore carries (a weight, a
 * litter count) live in their own records, linked here, and count only once accepted.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE mentorship_settings (
      coop_id uuid PRIMARY KEY REFERENCES cooperatives(id),
      chore_kinds jsonb NOT NULL,
      require_dangerous_sign_off boolean NOT NULL DEFAULT true,
      version integer NOT NULL DEFAULT 0,
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    ${tenantIsolation('mentorship_settings')}
    GRANT SELECT, INSERT, UPDATE ON mentorship_settings TO ${appRole};

    CREATE TABLE skills (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      key text NOT NULL CHECK (key ~ '^[a-z0-9-]{1,60}$'),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      area text NOT NULL CHECK (length(area) BETWEEN 1 AND 60),
      signed_off_means text NOT NULL CHECK (length(signed_off_means) BETWEEN 1 AND 1000),
      dangerous boolean NOT NULL DEFAULT false,
      position integer NOT NULL,
      retired_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT skills_key_unique UNIQUE (coop_id, key)
    );
    ${tenantIsolation('skills')}
    GRANT SELECT, INSERT, UPDATE ON skills TO ${appRole};

    CREATE TABLE chore_entries (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      apprentice_id uuid NOT NULL REFERENCES users(id),
      kind text NOT NULL CHECK (kind ~ '^[a-z0-9-]{1,60}$'),
      done_on date NOT NULL,
      minutes integer NOT NULL CHECK (minutes BETWEEN 1 AND 960),
      animal_id uuid,
      litter_id uuid,
      group_id uuid,
      notes text NOT NULL DEFAULT '' CHECK (length(notes) <= 2000),
      weigh_in_id uuid,
      litter_event_id uuid,
      review_state text NOT NULL CHECK (review_state IN ('pending', 'accepted', 'returned')),
      reviewed_by uuid REFERENCES users(id),
      reviewed_at timestamptz,
      review_comment text CHECK (length(review_comment) <= 500),
      submitted_at timestamptz NOT NULL DEFAULT now(),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz
    );
    CREATE INDEX chore_entries_apprentice_idx ON chore_entries (apprentice_id, done_on DESC, id) WHERE deleted_at IS NULL;
    CREATE INDEX chore_entries_review_idx ON chore_entries (farm_id, review_state, submitted_at) WHERE deleted_at IS NULL;
    ${tenantIsolation('chore_entries')}
    GRANT SELECT, INSERT, UPDATE ON chore_entries TO ${appRole};

    CREATE TABLE skill_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      apprentice_id uuid NOT NULL REFERENCES users(id),
      skill_key text NOT NULL,
      state text NOT NULL CHECK (state IN ('practising', 'signed-off', 'withdrawn')),
      on_date date NOT NULL,
      comment text NOT NULL DEFAULT '' CHECK (length(comment) <= 1000),
      entry_ids uuid[] NOT NULL DEFAULT '{}',
      mentor_id uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX skill_events_apprentice_idx ON skill_events (apprentice_id, skill_key, created_at);
    ${tenantIsolation('skill_events')}
    GRANT SELECT, INSERT ON skill_events TO ${appRole};

    -- A chore's photos go through the photo pipeline beside animals' and farms'.
    ALTER TABLE photos ADD COLUMN chore_entry_id uuid REFERENCES chore_entries(id);
    ALTER TABLE photos DROP CONSTRAINT photos_subject_shape;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_check;
    ALTER TABLE photos ADD CONSTRAINT photos_subject_check CHECK (subject IN ('animal', 'farm', 'chore'));
    ALTER TABLE photos ADD CONSTRAINT photos_subject_shape CHECK (
      ((subject = 'animal') = (animal_id IS NOT NULL)) AND ((subject = 'chore') = (chore_entry_id IS NOT NULL)));
    CREATE INDEX photos_chore_idx ON photos (chore_entry_id, created_at) WHERE deleted_at IS NULL AND chore_entry_id IS NOT NULL;
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DELETE FROM photos WHERE subject = 'chore';
    DROP INDEX IF EXISTS photos_chore_idx;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_shape;
    ALTER TABLE photos DROP CONSTRAINT photos_subject_check;
    ALTER TABLE photos ADD CONSTRAINT photos_subject_check CHECK (subject IN ('animal', 'farm'));
    ALTER TABLE photos ADD CONSTRAINT photos_subject_shape CHECK ((subject = 'animal') = (animal_id IS NOT NULL));
    ALTER TABLE photos DROP COLUMN chore_entry_id;
    DROP TABLE IF EXISTS skill_events;
    DROP TABLE IF EXISTS chore_entries;
    DROP TABLE IF EXISTS skills;
    DROP TABLE IF EXISTS mentorship_settings;
  `);
};
