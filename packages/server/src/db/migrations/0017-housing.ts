import type { MigrationFn } from '../migrator';

/**
 * Hutches and pens as housing units, with dated placements of animals and litters (later
 * issues allocate feed by pen). A placement is current until it ends; one current placement per animal
 * and per litter, enforced by partial unique indexes.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE housing_units (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 40),
      kind text NOT NULL CHECK (kind IN ('hutch', 'pen', 'colony', 'grow_out')),
      capacity integer CHECK (capacity IS NULL OR capacity BETWEEN 1 AND 200),
      notes text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT housing_units_coop_id_unique UNIQUE (coop_id, id)
    );
    CREATE UNIQUE INDEX housing_units_farm_name_unique ON housing_units (farm_id, lower(name)) WHERE deleted_at IS NULL;

    CREATE TABLE housing_placements (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      unit_id uuid NOT NULL,
      animal_id uuid,
      litter_id uuid,
      placed_on date NOT NULL,
      ended_on date,
      note text NOT NULL DEFAULT '',
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT housing_placements_unit FOREIGN KEY (coop_id, unit_id) REFERENCES housing_units (coop_id, id),
      CONSTRAINT housing_placements_animal FOREIGN KEY (coop_id, animal_id) REFERENCES animals (coop_id, id),
      CONSTRAINT housing_placements_litter FOREIGN KEY (coop_id, litter_id) REFERENCES litters (coop_id, id),
      CONSTRAINT housing_placements_one_occupant CHECK ((animal_id IS NULL) <> (litter_id IS NULL)),
      CONSTRAINT housing_placements_order CHECK (ended_on IS NULL OR ended_on >= placed_on)
    );
    CREATE UNIQUE INDEX housing_placements_animal_current ON housing_placements (animal_id) WHERE ended_on IS NULL AND animal_id IS NOT NULL;
    CREATE UNIQUE INDEX housing_placements_litter_current ON housing_placements (litter_id) WHERE ended_on IS NULL AND litter_id IS NOT NULL;
    CREATE INDEX housing_placements_unit_idx ON housing_placements (unit_id, placed_on);
  `);
  for (const table of ['housing_units', 'housing_placements']) {
    await sql(`
      ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
      ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
      CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());
      GRANT SELECT, INSERT, UPDATE ON ${table} TO ${appRole};
    `);
  }
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS housing_placements, housing_units`);
};
