import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * A farm's offer of one of its bucks to the co-op: on loan and/or for stud service, with fees in cents,
 * the longest loan, rest between loans, terms, where he may travel and the health facts a borrower asks
 * for. One offer per buck: withdrawing hides it (status), offering again brings the same one back.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE stud_offers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      buck_id uuid NOT NULL,
      status text NOT NULL DEFAULT 'offered' CHECK (status IN ('offered', 'withdrawn')),
      offers_loan boolean NOT NULL,
      offers_service boolean NOT NULL,
      loan_fee_cents integer CHECK (loan_fee_cents BETWEEN 0 AND 100000000),
      service_fee_cents integer CHECK (service_fee_cents BETWEEN 0 AND 100000000),
      longest_loan_days integer NOT NULL CHECK (longest_loan_days BETWEEN 1 AND 180),
      rest_days integer NOT NULL CHECK (rest_days BETWEEN 0 AND 120),
      terms text NOT NULL DEFAULT '' CHECK (length(terms) <= 2000),
      travel_area text NOT NULL DEFAULT '' CHECK (length(travel_area) <= 120),
      last_health_check_on date,
      rhdv2_vaccinated_on date,
      known_conditions text NOT NULL DEFAULT '' CHECK (length(known_conditions) <= 1000),
      photo_ids uuid[] NOT NULL DEFAULT '{}',
      share_weights boolean NOT NULL DEFAULT true,
      created_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT stud_offers_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT stud_offers_one_per_buck UNIQUE (coop_id, buck_id),
      CONSTRAINT stud_offers_buck FOREIGN KEY (coop_id, buck_id) REFERENCES animals (coop_id, id),
      CONSTRAINT stud_offers_something CHECK (offers_loan OR offers_service)
    );
    CREATE INDEX stud_offers_listed_idx ON stud_offers (coop_id, status, created_at DESC, id);
    CREATE INDEX stud_offers_farm_idx ON stud_offers (farm_id, created_at DESC, id);
    ${tenantIsolation('stud_offers')}
    GRANT SELECT, INSERT, UPDATE ON stud_offers TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS stud_offers`);
};
