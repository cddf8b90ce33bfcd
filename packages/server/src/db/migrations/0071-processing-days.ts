import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * A shared processing day at a site, with its stations (roster places), equipment checklist and the
 * people on the roster. The day's row is the lock every booking takes, so capacity is counted by one
 * request at a time.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_days (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      site_id uuid NOT NULL REFERENCES processing_sites(id),
      host_farm_id uuid NOT NULL REFERENCES farms(id),
      date date NOT NULL,
      start_time text NOT NULL CHECK (start_time ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$'),
      capacity_head integer NOT NULL CHECK (capacity_head > 0),
      sign_up_deadline date NOT NULL CHECK (sign_up_deadline <= date),
      fee_per_head_cents bigint NOT NULL CHECK (fee_per_head_cents >= 0),
      expected_costs jsonb NOT NULL DEFAULT '[]',
      actual_costs jsonb,
      notes text NOT NULL DEFAULT '',
      status text NOT NULL DEFAULT 'scheduled' CHECK (status IN ('scheduled', 'closed', 'cancelled')),
      scheduled_by uuid REFERENCES users(id),
      closed_at timestamptz,
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX processing_days_by_date ON processing_days (coop_id, date, id);
    ${tenantIsolation('processing_days')}
    GRANT SELECT, INSERT, UPDATE ON processing_days TO ${appRole};

    CREATE TABLE processing_day_stations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      day_id uuid NOT NULL REFERENCES processing_days(id),
      name text NOT NULL,
      position integer NOT NULL,
      places integer NOT NULL CHECK (places BETWEEN 1 AND 30),
      deleted_at timestamptz
    );
    CREATE INDEX processing_day_stations_day ON processing_day_stations (day_id, position);
    ${tenantIsolation('processing_day_stations')}
    GRANT SELECT, INSERT, UPDATE ON processing_day_stations TO ${appRole};

    CREATE TABLE processing_day_roster (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      day_id uuid NOT NULL REFERENCES processing_days(id),
      station_id uuid NOT NULL REFERENCES processing_day_stations(id),
      position integer NOT NULL CHECK (position >= 1),
      user_id uuid NOT NULL REFERENCES users(id),
      farm_id uuid REFERENCES farms(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (station_id, position),
      UNIQUE (day_id, user_id)
    );
    ${tenantIsolation('processing_day_roster')}
    GRANT SELECT, INSERT, DELETE ON processing_day_roster TO ${appRole};

    CREATE TABLE processing_day_equipment (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      day_id uuid NOT NULL REFERENCES processing_days(id),
      name text NOT NULL,
      position integer NOT NULL,
      brought_by_farm_id uuid REFERENCES farms(id),
      deleted_at timestamptz
    );
    CREATE INDEX processing_day_equipment_day ON processing_day_equipment (day_id, position);
    ${tenantIsolation('processing_day_equipment')}
    GRANT SELECT, INSERT, UPDATE ON processing_day_equipment TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TABLE IF EXISTS processing_day_equipment;
    DROP TABLE IF EXISTS processing_day_roster;
    DROP TABLE IF EXISTS processing_day_stations;
    DROP TABLE IF EXISTS processing_days;
  `);
};
