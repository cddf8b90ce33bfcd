import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Swap Board listings: breeding stock (animals of the seller's herd), a count of grow-out, or a wanted
 * post. The seller's farm alone changes its listings; the co-op reads the open ones. Never deleted: a
 * sold, withdrawn or expired listing stays in both farms' history.
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE swap_listings (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      farm_id uuid NOT NULL REFERENCES farms(id),
      kind text NOT NULL CHECK (kind IN ('breeding_stock', 'grow_out', 'wanted')),
      state text NOT NULL DEFAULT 'draft' CHECK (state IN ('draft', 'open', 'under_offer', 'sold', 'withdrawn', 'expired')),
      title text NOT NULL CHECK (length(title) BETWEEN 1 AND 120),
      description text NOT NULL DEFAULT '' CHECK (length(description) <= 2000),
      price_mode text NOT NULL CHECK (price_mode IN ('price', 'trade', 'offers')),
      price_cents integer CHECK (price_cents BETWEEN 0 AND 100000000),
      collect_place text NOT NULL DEFAULT '',
      valid_until date NOT NULL,
      animal_ids uuid[] NOT NULL DEFAULT '{}',
      photo_ids uuid[] NOT NULL DEFAULT '{}',
      share_weights boolean NOT NULL DEFAULT true,
      group_id uuid,
      head_count integer CHECK (head_count BETWEEN 1 AND 500),
      ready_on date,
      wanted_breed_id uuid,
      wanted_sex text CHECK (wanted_sex IN ('doe', 'buck')),
      wanted_age text CHECK (wanted_age IN ('kit', 'junior', 'senior')),
      wanted_by date,
      closed_reason text,
      created_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT swap_listings_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT swap_listings_price CHECK ((price_mode = 'price') = (price_cents IS NOT NULL)),
      CONSTRAINT swap_listings_stock CHECK (kind <> 'breeding_stock' OR cardinality(animal_ids) BETWEEN 1 AND 12),
      CONSTRAINT swap_listings_grow_out CHECK (kind <> 'grow_out' OR (group_id IS NOT NULL AND head_count IS NOT NULL))
    );
    CREATE INDEX swap_listings_board_idx ON swap_listings (coop_id, state, created_at DESC, id);
    CREATE INDEX swap_listings_farm_idx ON swap_listings (farm_id, created_at DESC, id);
    CREATE INDEX swap_listings_price_idx ON swap_listings (coop_id, price_cents, id) WHERE state IN ('open', 'under_offer');
    CREATE INDEX swap_listings_animals_idx ON swap_listings USING gin (animal_ids);
    ${tenantIsolation('swap_listings')}
    GRANT SELECT, INSERT, UPDATE ON swap_listings TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS swap_listings');
};
