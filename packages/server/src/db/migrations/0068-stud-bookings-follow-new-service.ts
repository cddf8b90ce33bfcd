import type { MigrationFn } from '../migrator';

/**
 * A service just inserted has no booking to clear: the trigger deletes only on an update. On a large
 * load in one transaction the delete ran once per service, and while `stud_bookings`' statistics still
 * said "empty" its plan scanned the whole growing table each time (quadratic: a 100,000-animal co-op's
 * services never finished loading).
 */
const body = (deleteOn: string) => `
    CREATE OR REPLACE FUNCTION stud_bookings_follow_service() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE lane_start bigint;
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.serviced_on IS NOT DISTINCT FROM OLD.serviced_on AND NEW.buck_id = OLD.buck_id
         AND NEW.farm_id = OLD.farm_id AND NEW.deleted_at IS NOT DISTINCT FROM OLD.deleted_at THEN
        RETURN NEW;
      END IF;
      IF ${deleteOn} THEN
        DELETE FROM stud_bookings WHERE service_id = NEW.id;
      END IF;
      IF NEW.deleted_at IS NULL AND EXISTS (SELECT 1 FROM animals a WHERE a.id = NEW.buck_id AND a.owning_farm_id = NEW.farm_id) THEN
        lane_start := nextval('stud_booking_lanes');
        INSERT INTO stud_bookings (coop_id, buck_id, service_id, during, held, lane)
        VALUES (NEW.coop_id, NEW.buck_id, NEW.id, daterange(NEW.serviced_on, NEW.serviced_on, '[]'), 'empty', int8range(lane_start, lane_start + 1));
      END IF;
      RETURN NEW;
    END $$;`;

export const up: MigrationFn = async ({ context: { sql } }) => {
  await sql(body(`TG_OP = 'UPDATE'`));
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(body('true'));
};
