import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * The Ledger's accounts: one per farm and the co-op's own (dues, processing site, card clearing, cash).
 * Each row caches its balances (posted, and pending in and out), updated under a row lock in the same
 * transaction as the transfer that moves them; a test compares them with the sum of the transfers.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE ledger_accounts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid REFERENCES farms(id),
      kind text NOT NULL CHECK (kind IN ('farm', 'coop_dues', 'coop_processing', 'coop_card_clearing', 'coop_cash')),
      posted_cents bigint NOT NULL DEFAULT 0,
      pending_debit_cents bigint NOT NULL DEFAULT 0 CHECK (pending_debit_cents >= 0),
      pending_credit_cents bigint NOT NULL DEFAULT 0 CHECK (pending_credit_cents >= 0),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT ledger_accounts_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT ledger_accounts_farm_kind CHECK ((kind = 'farm') = (farm_id IS NOT NULL))
    );
    CREATE UNIQUE INDEX ledger_accounts_one_per_farm ON ledger_accounts (coop_id, farm_id) WHERE farm_id IS NOT NULL;
    CREATE UNIQUE INDEX ledger_accounts_one_per_coop_kind ON ledger_accounts (coop_id, kind) WHERE farm_id IS NULL;
    ${tenantIsolation('ledger_accounts')}
    GRANT SELECT, INSERT, UPDATE ON ledger_accounts TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS ledger_accounts`);
};
