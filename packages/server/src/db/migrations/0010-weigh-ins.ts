import type { MigrationFn } from '../migrator';

/**
 * One table for the weight of an animal or of a group (a litter, a grow-out pen): total grams over a
 * head count. Farm-private. An apprentice's entry waits for the mentor's review (pending → accepted or
 * returned) and reads as unverified until accepted; a member's entry is accepted as it is made.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE weigh_ins (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      animal_id uuid,
      -- A group weigh-in: the grow-out and litter issues add their tables and a foreign key on group_id.
      group_id uuid,
      group_label text,
      total_grams integer NOT NULL CHECK (total_grams > 0 AND total_grams <= 1000000),
      head_count integer NOT NULL CHECK (head_count BETWEEN 1 AND 500),
      weighed_on date NOT NULL,
      note text NOT NULL DEFAULT '',
      entered_by uuid NOT NULL REFERENCES users(id),
      review_state text NOT NULL DEFAULT 'accepted' CHECK (review_state IN ('pending', 'accepted', 'returned')),
      reviewed_by uuid REFERENCES users(id),
      reviewed_at timestamptz,
      review_comment text,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT weigh_ins_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT weigh_ins_subject CHECK (
        (animal_id IS NOT NULL AND head_count = 1)
        OR (animal_id IS NULL AND (group_id IS NOT NULL OR group_label IS NOT NULL))
      )
    );
    CREATE INDEX weigh_ins_animal_idx ON weigh_ins (animal_id, weighed_on) WHERE deleted_at IS NULL;
    CREATE INDEX weigh_ins_farm_review_idx ON weigh_ins (farm_id, review_state) WHERE deleted_at IS NULL;

    ALTER TABLE weigh_ins ENABLE ROW LEVEL SECURITY;
    ALTER TABLE weigh_ins FORCE ROW LEVEL SECURITY;
    CREATE POLICY weigh_ins_tenant ON weigh_ins USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT, UPDATE ON weigh_ins TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS weigh_ins`);
};
