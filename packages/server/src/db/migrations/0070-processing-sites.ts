import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/** The co-op's processing sites: a member farm's place with its capacity a day, chill capacity and water. */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_sites (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      host_farm_id uuid NOT NULL REFERENCES farms(id),
      name text NOT NULL CHECK (length(name) BETWEEN 2 AND 80),
      address text NOT NULL,
      capacity_head_per_day integer NOT NULL CHECK (capacity_head_per_day > 0),
      chill_capacity_head integer NOT NULL CHECK (chill_capacity_head >= 0),
      water text NOT NULL CHECK (water IN ('potable_mains', 'potable_well', 'carried_in', 'none')),
      host_may_schedule boolean NOT NULL DEFAULT false,
      notes text NOT NULL DEFAULT '',
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX processing_sites_name ON processing_sites (coop_id, lower(name));
    ${tenantIsolation('processing_sites')}
    GRANT SELECT, INSERT, UPDATE ON processing_sites TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS processing_sites;');
};
