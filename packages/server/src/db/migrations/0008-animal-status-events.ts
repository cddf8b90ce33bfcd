import type { MigrationFn } from '../migrator';

/**
 * Dated history of two of an animal's three status parts: lifecycle (kit, junior, breeding, retired)
 * and disposition (on farm, sold, transferred, processed, died, culled, with a cause). The third,
 * custody, is the history of moves in animal_custody_events. The animal row holds the current value.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE animal_status_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      animal_id uuid NOT NULL,
      -- The farm that recorded the change (the animal's owner at the time).
      farm_id uuid REFERENCES farms(id),
      kind text NOT NULL CHECK (kind IN ('lifecycle', 'disposition')),
      value text NOT NULL,
      cause text,
      effective_on date NOT NULL,
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT animal_status_events_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT animal_status_events_value CHECK (
        (kind = 'lifecycle' AND value IN ('kit', 'junior', 'breeding', 'retired'))
        OR (kind = 'disposition' AND value IN ('on_farm', 'sold', 'transferred', 'processed', 'died', 'culled'))
      ),
      CONSTRAINT animal_status_events_cull_cause CHECK (NOT (kind = 'disposition' AND value = 'culled' AND cause IS NULL))
    );
    CREATE INDEX animal_status_events_animal_idx ON animal_status_events (animal_id, effective_on, created_at);

    ALTER TABLE animal_status_events ENABLE ROW LEVEL SECURITY;
    ALTER TABLE animal_status_events FORCE ROW LEVEL SECURITY;
    CREATE POLICY animal_status_events_tenant ON animal_status_events
      USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    GRANT SELECT, INSERT ON animal_status_events TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS animal_status_events`);
};
