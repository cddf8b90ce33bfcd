import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Feed bought by a farm, in whole bags: grams and integer cents, the crude protein on the tag. Feed
 * given draws on these first bought, first used within each feed (the product name, compared without
 * case). Never hard-deleted: feed given refers to them.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE feed_purchases (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      bought_on date NOT NULL,
      product_name text NOT NULL CHECK (length(product_name) BETWEEN 1 AND 80),
      bag_grams integer NOT NULL CHECK (bag_grams BETWEEN 100 AND 100000),
      bags integer NOT NULL CHECK (bags BETWEEN 1 AND 1000),
      price_cents bigint NOT NULL CHECK (price_cents >= 0),
      crude_protein_percent numeric(4,1) CHECK (crude_protein_percent BETWEEN 0 AND 60),
      note text NOT NULL DEFAULT '',
      entered_by uuid NOT NULL REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      deleted_at timestamptz,
      CONSTRAINT feed_purchases_coop_id_unique UNIQUE (coop_id, id)
    );
    CREATE INDEX feed_purchases_farm_idx ON feed_purchases (farm_id, bought_on) WHERE deleted_at IS NULL;
    ${tenantIsolation('feed_purchases')}
    GRANT SELECT, INSERT, UPDATE ON feed_purchases TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql(`DROP TABLE IF EXISTS feed_purchases`);
};
