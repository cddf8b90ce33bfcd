import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * The dates a buck is held, where the database itself refuses a double booking (two requests accepted
 * at once both pass any check made before the insert; an exclusion constraint does not).
 *
 * - An accepted loan or service visit holds `during` (first to last day) and, between loans, `held`
 *   (during plus the offer's rest days): two loans' `held` never overlap.
 * - His owning farm's own services with him hold their day (kept here by a trigger on services), and
 *   no loan may overlap one. Services among themselves may share a day (a doe bred twice), so each
 *   service row has a lane of its own while a loan's lane is unbounded: two rows clash only when the
 *   buck, the days and the lanes all overlap, i.e. whenever a loan is one of them.
 * - Services recorded at a borrowing farm with him are not his owning farm's and hold nothing.
 *
 * btree_gist gives gist the equality on uuid; it is a trusted extension, so the owner role creates it.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE EXTENSION IF NOT EXISTS btree_gist;
    CREATE SEQUENCE stud_booking_lanes;
    CREATE TABLE stud_bookings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      buck_id uuid NOT NULL,
      loan_id uuid,
      service_id uuid,
      during daterange NOT NULL CHECK (NOT isempty(during)),
      held daterange NOT NULL,
      lane int8range NOT NULL,
      CONSTRAINT stud_bookings_buck FOREIGN KEY (coop_id, buck_id) REFERENCES animals (coop_id, id),
      CONSTRAINT stud_bookings_loan FOREIGN KEY (coop_id, loan_id) REFERENCES stud_loans (coop_id, id),
      CONSTRAINT stud_bookings_one_source CHECK ((loan_id IS NULL) <> (service_id IS NULL)),
      CONSTRAINT stud_bookings_no_double_booking EXCLUDE USING gist (buck_id WITH =, during WITH &&, lane WITH &&),
      CONSTRAINT stud_bookings_rest_between_loans EXCLUDE USING gist (buck_id WITH =, held WITH &&) WHERE (loan_id IS NOT NULL)
    );
    CREATE UNIQUE INDEX stud_bookings_loan_unique ON stud_bookings (loan_id) WHERE loan_id IS NOT NULL;
    CREATE INDEX stud_bookings_service_idx ON stud_bookings (service_id) WHERE service_id IS NOT NULL;
    ${tenantIsolation('stud_bookings')}
    GRANT SELECT, INSERT, UPDATE, DELETE ON stud_bookings TO ${appRole};
    GRANT USAGE ON SEQUENCE stud_booking_lanes TO ${appRole};

    CREATE FUNCTION stud_bookings_follow_service() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE lane_start bigint;
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.serviced_on IS NOT DISTINCT FROM OLD.serviced_on AND NEW.buck_id = OLD.buck_id
         AND NEW.farm_id = OLD.farm_id AND NEW.deleted_at IS NOT DISTINCT FROM OLD.deleted_at THEN
        RETURN NEW;
      END IF;
      DELETE FROM stud_bookings WHERE service_id = NEW.id;
      IF NEW.deleted_at IS NULL AND EXISTS (SELECT 1 FROM animals a WHERE a.id = NEW.buck_id AND a.owning_farm_id = NEW.farm_id) THEN
        lane_start := nextval('stud_booking_lanes');
        INSERT INTO stud_bookings (coop_id, buck_id, service_id, during, held, lane)
        VALUES (NEW.coop_id, NEW.buck_id, NEW.id, daterange(NEW.serviced_on, NEW.serviced_on, '[]'), 'empty', int8range(lane_start, lane_start + 1));
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER services_hold_stud_days AFTER INSERT OR UPDATE ON services FOR EACH ROW EXECUTE FUNCTION stud_bookings_follow_service();
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`
    DROP TRIGGER IF EXISTS services_hold_stud_days ON services;
    DROP FUNCTION IF EXISTS stud_bookings_follow_service();
    DROP TABLE IF EXISTS stud_bookings;
    DROP SEQUENCE IF EXISTS stud_booking_lanes;
  `);
};
