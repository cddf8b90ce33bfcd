import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Requests for a buck and the loans (or stud-service visits) they become, with their history. The two
 * farms are kept on the row (the buck's owning farm and the requesting farm): they alone see it. The
 * hand-over and the return are each recorded by one farm and confirmed by the other (jsonb steps).
 * Never deleted: a declined or cancelled request stays in both farms' history.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE stud_loans (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      offer_id uuid NOT NULL,
      buck_id uuid NOT NULL,
      kind text NOT NULL CHECK (kind IN ('loan', 'service')),
      state text NOT NULL DEFAULT 'requested'
        CHECK (state IN ('requested', 'dates_proposed', 'accepted', 'declined', 'cancelled', 'handed_over', 'returned', 'served')),
      owner_farm_id uuid NOT NULL REFERENCES farms(id),
      borrower_farm_id uuid NOT NULL REFERENCES farms(id),
      doe_ids uuid[] NOT NULL,
      start_on date NOT NULL,
      end_on date NOT NULL,
      proposed_start_on date,
      proposed_end_on date,
      message text NOT NULL DEFAULT '' CHECK (length(message) <= 1000),
      decline_reason text,
      fee_cents integer CHECK (fee_cents BETWEEN 0 AND 100000000),
      rest_days integer NOT NULL DEFAULT 0,
      hand_over jsonb,
      return_step jsonb,
      overdue_noticed_at timestamptz,
      requested_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT stud_loans_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT stud_loans_offer FOREIGN KEY (coop_id, offer_id) REFERENCES stud_offers (coop_id, id),
      CONSTRAINT stud_loans_buck FOREIGN KEY (coop_id, buck_id) REFERENCES animals (coop_id, id),
      CONSTRAINT stud_loans_dates CHECK (start_on <= end_on),
      CONSTRAINT stud_loans_proposal CHECK ((proposed_start_on IS NULL) = (proposed_end_on IS NULL)),
      CONSTRAINT stud_loans_two_farms CHECK (owner_farm_id <> borrower_farm_id),
      CONSTRAINT stud_loans_does CHECK (cardinality(doe_ids) BETWEEN 1 AND 12)
    );
    CREATE INDEX stud_loans_owner_idx ON stud_loans (owner_farm_id, created_at DESC, id);
    CREATE INDEX stud_loans_borrower_idx ON stud_loans (borrower_farm_id, created_at DESC, id);
    CREATE INDEX stud_loans_buck_idx ON stud_loans (buck_id, start_on);
    ${tenantIsolation('stud_loans')}
    GRANT SELECT, INSERT, UPDATE ON stud_loans TO ${appRole};

    CREATE TABLE stud_loan_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      loan_id uuid NOT NULL,
      kind text NOT NULL,
      farm_id uuid REFERENCES farms(id),
      actor_id uuid REFERENCES users(id),
      text text NOT NULL DEFAULT '',
      details jsonb NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT clock_timestamp(),
      CONSTRAINT stud_loan_events_loan FOREIGN KEY (coop_id, loan_id) REFERENCES stud_loans (coop_id, id)
    );
    CREATE INDEX stud_loan_events_loan_idx ON stud_loan_events (loan_id, created_at);
    ${tenantIsolation('stud_loan_events')}
    GRANT SELECT, INSERT ON stud_loan_events TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS stud_loan_events; DROP TABLE IF EXISTS stud_loans`);
};
