import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * The barn's temperature as a farm reads it: stored in °C to one decimal, whichever unit the
 * farm reads in. Rabbits suffer above about 85 °F / 29 °C, heavily pregnant does and young litters most
 * (Texas Extension, TAMUK): the latest reading drives the heat caution on Commons. Readings outside
 * −40…55 °C are not a barn's and are refused. Apprentices may log readings.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE temperature_readings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      taken_at timestamptz NOT NULL,
      celsius numeric(4,1) NOT NULL CHECK (celsius BETWEEN -40 AND 55),
      place text NOT NULL DEFAULT '' CHECK (length(place) <= 60),
      recorded_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT temperature_readings_coop_id_unique UNIQUE (coop_id, id)
    );
    CREATE INDEX temperature_readings_farm_idx ON temperature_readings (farm_id, taken_at DESC) WHERE deleted_at IS NULL;
    ${tenantIsolation('temperature_readings')}
    GRANT SELECT, INSERT, UPDATE ON temperature_readings TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS temperature_readings`);
};
