import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Links a farm's processing record to the day and booking it was made at, with the carcasses trimmed or
 * condemned and why; and each farm's choice whether its apprentices may staff the stations.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_day_yields (
      record_id uuid PRIMARY KEY REFERENCES processing_records(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      day_id uuid NOT NULL REFERENCES processing_days(id),
      booking_id uuid NOT NULL REFERENCES processing_bookings(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      trimmed_head integer NOT NULL DEFAULT 0 CHECK (trimmed_head >= 0),
      condemned_head integer NOT NULL DEFAULT 0 CHECK (condemned_head >= 0),
      outcome_reason text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX processing_day_yields_day ON processing_day_yields (day_id);
    ${tenantIsolation('processing_day_yields')}
    GRANT SELECT, INSERT ON processing_day_yields TO ${appRole};

    CREATE TABLE processing_farm_settings (
      farm_id uuid PRIMARY KEY REFERENCES farms(id),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      apprentices_may_staff boolean NOT NULL DEFAULT false,
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    ${tenantIsolation('processing_farm_settings')}
    GRANT SELECT, INSERT, UPDATE ON processing_farm_settings TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TABLE IF EXISTS processing_farm_settings;
    DROP TABLE IF EXISTS processing_day_yields;
  `);
};
