import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Card payments: one row per checkout a member opened with the card service. Only a verified webhook
 * settles it, once: the payment transfer's id is the card service's event id, and the row keeps it.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE card_checkouts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      idempotency_key uuid NOT NULL,
      purpose text NOT NULL CHECK (purpose IN ('dues', 'balance')),
      dues_period_id uuid REFERENCES dues_periods(id),
      amount_cents bigint NOT NULL CHECK (amount_cents > 0),
      currency char(3) NOT NULL,
      status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'paid', 'declined')),
      session_id text,
      url text,
      transfer_id text,
      created_by uuid NOT NULL REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      settled_at timestamptz
    );
    CREATE UNIQUE INDEX card_checkouts_once ON card_checkouts (coop_id, idempotency_key);
    CREATE UNIQUE INDEX card_checkouts_session ON card_checkouts (session_id) WHERE session_id IS NOT NULL;
    CREATE INDEX card_checkouts_farm_idx ON card_checkouts (farm_id, status);
    ${tenantIsolation('card_checkouts')}
    GRANT SELECT, INSERT, UPDATE ON card_checkouts TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS card_checkouts`);
};
