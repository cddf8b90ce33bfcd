import type { MigrationFn } from '../migrator';

/**
 * Figures derived from the whole co-op's pedigree: each animal's coefficient of inbreeding and its
 * breed make-up. They change for many rows at once when one parent changes, so they live apart from
 * `animals` (architecture, "Data"): recomputing never bumps the version of a record people edit.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE animal_inbreeding (
      animal_id uuid PRIMARY KEY,
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      coi double precision NOT NULL CHECK (coi >= 0 AND coi <= 1),
      computed_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT animal_inbreeding_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id)
    );
    CREATE INDEX animal_inbreeding_coop_idx ON animal_inbreeding (coop_id);

    CREATE TABLE animal_breed_makeups (
      animal_id uuid PRIMARY KEY,
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      -- breed id → fraction; the fractions and unknown add up to 1.
      breeds jsonb NOT NULL DEFAULT '{}',
      unknown double precision NOT NULL CHECK (unknown >= 0 AND unknown <= 1),
      purity text NOT NULL CHECK (purity IN ('purebred', 'known_cross', 'partly_unknown', 'unknown')),
      computed_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT animal_breed_makeups_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id)
    );
    CREATE INDEX animal_breed_makeups_coop_idx ON animal_breed_makeups (coop_id);
    CREATE INDEX animal_breed_makeups_breeds_idx ON animal_breed_makeups USING gin (breeds);
  `);
  for (const table of ['animal_inbreeding', 'animal_breed_makeups']) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
      GRANT SELECT, INSERT, UPDATE ON ${table} TO ${appRole};
    `);
  }
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS animal_breed_makeups, animal_inbreeding`);
};
