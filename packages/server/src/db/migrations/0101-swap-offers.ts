import type { MigrationFn } from '../migrator';
import { tenantIsolation } from '../tenant-isolation-sql';

/**
 * Offers on a listing, with their thread of counter-offers. The terms on the row are the latest; who
 * answers next is `awaiting`. At most one offer of a listing is ever accepted (the database refuses a
 * second one, whatever the requests race). The client may choose the id (a retried offer is one offer).
 */
export const up: MigrationFn = async ({ context: { sql, appRole } }) => {
  await sql(`
    CREATE TABLE swap_offers (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      listing_id uuid NOT NULL,
      seller_farm_id uuid NOT NULL REFERENCES farms(id),
      buyer_farm_id uuid NOT NULL REFERENCES farms(id),
      state text NOT NULL DEFAULT 'open'
        CHECK (state IN ('open', 'accepted', 'collected', 'failed', 'declined', 'withdrawn', 'expired')),
      awaiting text NOT NULL DEFAULT 'seller' CHECK (awaiting IN ('seller', 'buyer')),
      price_cents integer CHECK (price_cents BETWEEN 0 AND 100000000),
      trade_animal_ids uuid[] NOT NULL DEFAULT '{}',
      message text NOT NULL DEFAULT '' CHECK (length(message) <= 1000),
      valid_until date NOT NULL,
      accept_key uuid,
      accepted_on date,
      closed_reason text,
      created_by uuid REFERENCES users(id),
      version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT swap_offers_coop_id_unique UNIQUE (coop_id, id),
      CONSTRAINT swap_offers_listing FOREIGN KEY (coop_id, listing_id) REFERENCES swap_listings (coop_id, id),
      CONSTRAINT swap_offers_two_farms CHECK (seller_farm_id <> buyer_farm_id),
      CONSTRAINT swap_offers_terms CHECK (price_cents IS NOT NULL OR cardinality(trade_animal_ids) > 0),
      CONSTRAINT swap_offers_trade CHECK (cardinality(trade_animal_ids) <= 12)
    );
    CREATE UNIQUE INDEX swap_offers_one_sale ON swap_offers (listing_id) WHERE state IN ('accepted', 'collected');
    CREATE INDEX swap_offers_listing_idx ON swap_offers (listing_id, created_at, id);
    CREATE INDEX swap_offers_buyer_idx ON swap_offers (buyer_farm_id, updated_at DESC, id);
    CREATE INDEX swap_offers_seller_idx ON swap_offers (seller_farm_id, updated_at DESC, id);
    ${tenantIsolation('swap_offers')}
    GRANT SELECT, INSERT, UPDATE ON swap_offers TO ${appRole};

    CREATE TABLE swap_offer_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      coop_id uuid NOT NULL REFERENCES cooperatives(id),
      offer_id uuid NOT NULL,
      kind text NOT NULL,
      farm_id uuid REFERENCES farms(id),
      actor_id uuid REFERENCES users(id),
      price_cents integer,
      trade_animal_ids uuid[] NOT NULL DEFAULT '{}',
      text text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT clock_timestamp(),
      CONSTRAINT swap_offer_events_offer FOREIGN KEY (coop_id, offer_id) REFERENCES swap_offers (coop_id, id)
    );
    CREATE INDEX swap_offer_events_offer_idx ON swap_offer_events (offer_id, created_at);
    ${tenantIsolation('swap_offer_events')}
    GRANT SELECT, INSERT ON swap_offer_events TO ${appRole};
  `);
};

export const down: MigrationFn = async ({ context: { sql } }) => {
  await sql('DROP TABLE IF EXISTS swap_offer_events; DROP TABLE IF EXISTS swap_offers');
};
