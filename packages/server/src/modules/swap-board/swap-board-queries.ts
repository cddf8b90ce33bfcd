import { QueryTypes, type Transaction } from 'sequelize';
import type { Sex, SwapListingKind, SwapListingState, SwapOfferState, SwapPriceMode, SwapWantedAge } from '@burrowline/shared';
import { database } from '../../db/sequelize';

/** Plain SQL of the Swap Board, one statement each, over the current co-op (row-level security holds them to it). */
export async function rows<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}

export interface ListingRow {
  id: string;
  coop_id: string;
  farm_id: string;
  kind: SwapListingKind;
  state: SwapListingState;
  title: string;
  description: string;
  price_mode: SwapPriceMode;
  price_cents: number | null;
  collect_place: string;
  valid_until: string;
  animal_ids: string[];
  photo_ids: string[];
  share_weights: boolean;
  group_id: string | null;
  head_count: number | null;
  ready_on: string | null;
  wanted_breed_id: string | null;
  wanted_sex: Sex | null;
  wanted_age: SwapWantedAge | null;
  wanted_by: string | null;
  closed_reason: string | null;
  created_by: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  /** Joined: open offers on it. */
  open_offers: number;
  total_count?: string;
}

export const LISTING_COLUMNS = `l.id, l.coop_id, l.farm_id, l.kind, l.state, l.title, l.description, l.price_mode, l.price_cents, l.collect_place,
  l.valid_until::text AS valid_until, l.animal_ids, l.photo_ids, l.share_weights, l.group_id, l.head_count, l.ready_on::text AS ready_on,
  l.wanted_breed_id, l.wanted_sex, l.wanted_age, l.wanted_by::text AS wanted_by, l.closed_reason, l.created_by, l.version, l.created_at, l.updated_at,
  (SELECT count(*)::int FROM swap_offers o WHERE o.listing_id = l.id AND o.state = 'open') AS open_offers`;

export async function listingById(tx: Transaction, listingId: string, lock = false): Promise<ListingRow | null> {
  const [row] = await rows<ListingRow>(tx, `SELECT ${LISTING_COLUMNS} FROM swap_listings l WHERE l.id = $1 ${lock ? 'FOR UPDATE OF l' : ''}`, [listingId]);
  return row ?? null;
}

export interface OfferRow {
  id: string;
  coop_id: string;
  listing_id: string;
  seller_farm_id: string;
  buyer_farm_id: string;
  state: SwapOfferState;
  awaiting: 'seller' | 'buyer';
  price_cents: number | null;
  trade_animal_ids: string[];
  message: string;
  valid_until: string;
  accept_key: string | null;
  accepted_on: string | null;
  closed_reason: string | null;
  created_by: string | null;
  version: number;
  created_at: Date;
  updated_at: Date;
  listing_title: string;
  total_count?: string;
}

export const OFFER_COLUMNS = `o.id, o.coop_id, o.listing_id, o.seller_farm_id, o.buyer_farm_id, o.state, o.awaiting, o.price_cents, o.trade_animal_ids,
  o.message, o.valid_until::text AS valid_until, o.accept_key, o.accepted_on::text AS accepted_on, o.closed_reason, o.created_by, o.version,
  o.created_at, o.updated_at, (SELECT l.title FROM swap_listings l WHERE l.id = o.listing_id) AS listing_title`;

export async function offerById(tx: Transaction, offerId: string, lock = false): Promise<OfferRow | null> {
  const [row] = await rows<OfferRow>(tx, `SELECT ${OFFER_COLUMNS} FROM swap_offers o WHERE o.id = $1 ${lock ? 'FOR UPDATE OF o' : ''}`, [offerId]);
  return row ?? null;
}

export interface OfferEventRow {
  id: string;
  offer_id: string;
  kind: string;
  farm_id: string | null;
  actor_name: string | null;
  price_cents: number | null;
  trade_animal_ids: string[];
  text: string;
  created_at: Date;
}

export async function eventsOfOffers(tx: Transaction, offerIds: string[]): Promise<OfferEventRow[]> {
  if (offerIds.length === 0) return [];
  return rows<OfferEventRow>(
    tx,
    `SELECT e.id, e.offer_id, e.kind, e.farm_id, u.name AS actor_name, e.price_cents, e.trade_animal_ids, e.text, e.created_at
       FROM swap_offer_events e LEFT JOIN users u ON u.id = e.actor_id
      WHERE e.offer_id = ANY($1::uuid[]) ORDER BY e.created_at, e.id`,
    [offerIds],
  );
}

/** The latest accepted weigh-in of each animal recorded by the farm that lists it (what the seller publishes). */
export async function latestWeightsOf(tx: Transaction, pairs: { animalId: string; farmId: string }[]): Promise<Map<string, { grams: number; weighedOn: string }>> {
  if (pairs.length === 0) return new Map();
  const found = await rows<{ animal_id: string; grams: number; weighed_on: string }>(
    tx,
    `SELECT DISTINCT ON (wi.animal_id) wi.animal_id, wi.total_grams AS grams, wi.weighed_on::text AS weighed_on
       FROM weigh_ins wi
      WHERE (wi.animal_id, wi.farm_id) IN (SELECT * FROM unnest($1::uuid[], $2::uuid[]))
        AND wi.deleted_at IS NULL AND wi.review_state = 'accepted'
      ORDER BY wi.animal_id, wi.weighed_on DESC, wi.created_at DESC`,
    [pairs.map((p) => p.animalId), pairs.map((p) => p.farmId)],
  );
  return new Map(found.map((r) => [r.animal_id, { grams: r.grams, weighedOn: r.weighed_on }]));
}
