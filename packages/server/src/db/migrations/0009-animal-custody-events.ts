import type { MigrationFn } from '../migrator';

/**
 * The dated history of every move of an animal between farms: where it was born or arrived, each
 * transfer of ownership, each loan out and return. Later issues (loans, trades) only add rows here
 * (and update the animal's owning and keeping farm in the same transaction).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE animal_custody_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      animal_id uuid NOT NULL,
      kind text NOT NULL CHECK (kind IN ('born', 'arrived', 'transferred', 'lent', 'returned', 'left')),
      from_farm_id uuid REFERENCES farms(id),
      to_farm_id uuid REFERENCES farms(id),
      -- Where the animal stands after the move.
      owning_farm_id uuid REFERENCES farms(id),
      keeping_farm_id uuid REFERENCES farms(id),
      moved_on date NOT NULL,
      -- A tattoo that clashed at the destination was changed (re-tattooed or given a farm suffix).
      tattoo_before text,
      tattoo_after text,
      note text NOT NULL DEFAULT '',
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT animal_custody_events_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id)
    );
    CREATE INDEX animal_custody_events_animal_idx ON animal_custody_events (animal_id, moved_on, created_at);

    ALTER TABLE animal_custody_events ENABLE ROW LEVEL SECURITY;
    ALTER TABLE animal_custody_events FORCE ROW LEVEL SECURITY;
    CREATE POLICY animal_custody_events_tenant ON animal_custody_events
      USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT ON animal_custody_events TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS animal_custody_events`);
};
