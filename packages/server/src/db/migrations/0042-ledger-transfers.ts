import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * The Ledger's journal. A transfer debits one account and credits another by a positive amount in
 * integer cents; its id is the caller's (derived from its source), unique per co-op, so a retry finds the
 * original. Pending → posted or voided, never back; a posted transfer is never edited or deleted (the app
 * role may not delete, and only status and its instants change). A correction is a reversing transfer
 * pointing at the one it corrects.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE ledger_transfers (
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      id text NOT NULL CHECK (id ~ '^[A-Za-z0-9][A-Za-z0-9:_.-]{0,119}$'),
      kind text NOT NULL CHECK (kind IN ('stud_fee', 'processing_fee', 'shared_cost', 'sale', 'dues', 'payment', 'settlement', 'correction')),
      status text NOT NULL CHECK (status IN ('pending', 'posted', 'voided')),
      debit_account_id uuid NOT NULL,
      credit_account_id uuid NOT NULL,
      amount_cents bigint NOT NULL CHECK (amount_cents > 0),
      source_type text NOT NULL DEFAULT '',
      source_id text NOT NULL DEFAULT '',
      memo text NOT NULL DEFAULT '' CHECK (length(memo) <= 300),
      booked_on date NOT NULL,
      method text CHECK (method IN ('cash', 'cheque', 'bank_transfer', 'card')),
      corrects_transfer_id text,
      correction_reason text,
      awaiting_farm_id uuid REFERENCES farms(id),
      posted_by uuid REFERENCES users(id),
      created_at timestamptz NOT NULL DEFAULT now(),
      posted_at timestamptz,
      voided_at timestamptz,
      PRIMARY KEY (coop_id, id),
      CONSTRAINT ledger_transfers_debit FOREIGN KEY (coop_id, debit_account_id) REFERENCES ledger_accounts (coop_id, id),
      CONSTRAINT ledger_transfers_credit FOREIGN KEY (coop_id, credit_account_id) REFERENCES ledger_accounts (coop_id, id),
      CONSTRAINT ledger_transfers_corrects FOREIGN KEY (coop_id, corrects_transfer_id) REFERENCES ledger_transfers (coop_id, id),
      CONSTRAINT ledger_transfers_two_accounts CHECK (debit_account_id <> credit_account_id),
      CONSTRAINT ledger_transfers_correction CHECK ((kind = 'correction') = (corrects_transfer_id IS NOT NULL)),
      CONSTRAINT ledger_transfers_posted CHECK ((status = 'posted') = (posted_at IS NOT NULL)),
      CONSTRAINT ledger_transfers_voided CHECK ((status = 'voided') = (voided_at IS NOT NULL))
    );
    CREATE INDEX ledger_transfers_debit_idx ON ledger_transfers (debit_account_id, booked_on);
    CREATE INDEX ledger_transfers_credit_idx ON ledger_transfers (credit_account_id, booked_on);
    CREATE INDEX ledger_transfers_coop_booked_idx ON ledger_transfers (coop_id, booked_on DESC, created_at DESC);
    CREATE INDEX ledger_transfers_source_idx ON ledger_transfers (coop_id, source_type, source_id);
    CREATE INDEX ledger_transfers_corrects_idx ON ledger_transfers (coop_id, corrects_transfer_id) WHERE corrects_transfer_id IS NOT NULL;
    ${tenantIsolation('ledger_transfers')}
    GRANT SELECT, INSERT, UPDATE (status, posted_at, voided_at, posted_by, awaiting_farm_id, booked_on) ON ledger_transfers TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS ledger_transfers`);
};
