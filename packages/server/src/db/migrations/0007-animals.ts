import type { MigrationFn } from '../migrator';

/**
 * One animal, one record, for life. Co-op animals carry their breeding, owning and keeping
 * farm; outside animals (known only from papers) are rows of the same table with `is_outside` and no
 * farm, so a sire or dam reference is always an animal id and pedigree queries stay one self-join.
 * Parents must be of the same co-op: the composite keys make that a database fact, not only an app rule.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE animals (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      is_outside boolean NOT NULL DEFAULT false,
      breeding_farm_id uuid REFERENCES farms(id),
      -- Who bred it when that was not a co-op farm (from the papers or the seller).
      breeder_name text NOT NULL DEFAULT '',
      owning_farm_id uuid REFERENCES farms(id),
      keeping_farm_id uuid REFERENCES farms(id),
      tattoo text,
      name text NOT NULL DEFAULT '',
      sex text NOT NULL CHECK (sex IN ('buck', 'doe')),
      breed_id uuid REFERENCES breeds(id),
      colour text NOT NULL DEFAULT '',
      birth_date date,
      sire_id uuid,
      dam_id uuid,
      registration_number text,
      notes text NOT NULL DEFAULT '',
      hutch text NOT NULL DEFAULT '',
      lifecycle text NOT NULL DEFAULT 'kit' CHECK (lifecycle IN ('kit', 'junior', 'breeding', 'retired')),
      disposition text NOT NULL DEFAULT 'on_farm'
        CHECK (disposition IN ('on_farm', 'sold', 'transferred', 'processed', 'died', 'culled')),
      disposition_cause text,
      -- An outside duplicate merged by the admin points at the record that stands.
      merged_into_id uuid,
      created_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT animals_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT animals_sire_same_coop FOREIGN KEY (coop_id, sire_id) REFERENCES animals (coop_id, id),
      CONSTRAINT animals_dam_same_coop FOREIGN KEY (coop_id, dam_id) REFERENCES animals (coop_id, id),
      CONSTRAINT animals_merged_same_coop FOREIGN KEY (coop_id, merged_into_id) REFERENCES animals (coop_id, id),
      CONSTRAINT animals_not_own_parent CHECK (sire_id IS DISTINCT FROM id AND dam_id IS DISTINCT FROM id),
      CONSTRAINT animals_farms_by_kind CHECK (
        (is_outside AND owning_farm_id IS NULL AND keeping_farm_id IS NULL AND breeding_farm_id IS NULL)
        OR (NOT is_outside AND owning_farm_id IS NOT NULL AND keeping_farm_id IS NOT NULL
            AND tattoo IS NOT NULL AND birth_date IS NOT NULL)
      ),
      CONSTRAINT animals_tattoo_shape CHECK (tattoo IS NULL OR length(tattoo) BETWEEN 1 AND 20),
      CONSTRAINT animals_cause_when_culled CHECK (disposition <> 'culled' OR disposition_cause IS NOT NULL)
    );
    -- A tattoo is unique among the animals a farm currently keeps (alive and present); history keeps the rest.
    CREATE UNIQUE INDEX animals_kept_tattoo_unique ON animals (keeping_farm_id, lower(tattoo))
      WHERE deleted_at IS NULL AND NOT is_outside AND disposition = 'on_farm';
    -- The outside registry: one record per registration number in a co-op.
    CREATE UNIQUE INDEX animals_outside_registration_unique ON animals (coop_id, lower(registration_number))
      WHERE is_outside AND deleted_at IS NULL AND registration_number IS NOT NULL;
    CREATE INDEX animals_coop_idx ON animals (coop_id);
    CREATE INDEX animals_owning_farm_idx ON animals (owning_farm_id) WHERE deleted_at IS NULL;
    CREATE INDEX animals_keeping_farm_idx ON animals (keeping_farm_id) WHERE deleted_at IS NULL;
    CREATE INDEX animals_sire_idx ON animals (sire_id);
    CREATE INDEX animals_dam_idx ON animals (dam_id);

    ALTER TABLE animals ENABLE ROW LEVEL SECURITY;
    ALTER TABLE animals FORCE ROW LEVEL SECURITY;
    CREATE POLICY animals_tenant ON animals USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());

    -- Never hard-deleted: no DELETE grant.
    GRANT SELECT, INSERT, UPDATE ON animals TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS animals CASCADE`);
};
