import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * A farm's booking of head on a day. `queue_number` is taken while the day's row is locked, so it is
 * the definite order of the waitlist; the idempotency key makes a retried booking answer the original.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE processing_bookings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      day_id uuid NOT NULL REFERENCES processing_days(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      idempotency_key uuid NOT NULL,
      queue_number bigint GENERATED ALWAYS AS IDENTITY,
      status text NOT NULL CHECK (status IN ('booked', 'waitlisted', 'offered', 'cancelled')),
      head integer NOT NULL CHECK (head > 0),
      lines jsonb NOT NULL,
      offer_expires_at timestamptz,
      fee_revision integer NOT NULL DEFAULT 0,
      head_brought integer CHECK (head_brought >= 0),
      checked_in_at timestamptz,
      cancelled_reason text,
      booked_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT processing_bookings_offer CHECK ((status = 'offered') = (offer_expires_at IS NOT NULL))
    );
    CREATE UNIQUE INDEX processing_bookings_idempotency ON processing_bookings (coop_id, idempotency_key);
    CREATE INDEX processing_bookings_day ON processing_bookings (day_id, status, queue_number);
    CREATE INDEX processing_bookings_farm ON processing_bookings (farm_id, day_id);
    ${tenantIsolation('processing_bookings')}
    GRANT SELECT, INSERT, UPDATE ON processing_bookings TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS processing_bookings;');
};
