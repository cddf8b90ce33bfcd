import type { MigrationFn } from '../migrator';

/**
 * Dated observations about an animal (farm-private). Like weigh-ins, an apprentice's note waits for
 * the mentor's review; the animal's own `notes` field stays the members' summary.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE animal_notes (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      animal_id uuid NOT NULL,
      body text NOT NULL CHECK (length(body) BETWEEN 1 AND 2000),
      noted_on date NOT NULL,
      entered_by uuid NOT NULL REFERENCES users(id),
      review_state text NOT NULL DEFAULT 'accepted' CHECK (review_state IN ('pending', 'accepted', 'returned')),
      reviewed_by uuid REFERENCES users(id),
      reviewed_at timestamptz,
      review_comment text,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT animal_notes_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id)
    );
    CREATE INDEX animal_notes_animal_idx ON animal_notes (animal_id, noted_on) WHERE deleted_at IS NULL;

    ALTER TABLE animal_notes ENABLE ROW LEVEL SECURITY;
    ALTER TABLE animal_notes FORCE ROW LEVEL SECURITY;
    CREATE POLICY animal_notes_tenant ON animal_notes USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT, UPDATE ON animal_notes TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS animal_notes`);
};
