import { randomUUID } from 'node:crypto';
import {
  addDays, swapListingSchema, swapOfferSchema, type SwapListingBody, type SwapListingDto, type SwapOfferBody, type SwapOfferDto,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { createListing } from '../../packages/server/src/modules/swap-board/swap-listings.service';
import { makeOffer } from '../../packages/server/src/modules/swap-board/swap-offers.service';
import { farmToday } from './almanac';
import { asTenant } from './db';
import type { TestPerson } from './factories';
import { actorOf, addAnimalAs } from './herd';

export const inDays = (n: number) => addDays(farmToday(), n);

/** A junior doe of the person's farm, unless the fields say otherwise. */
export async function stockOf(person: TestPerson, fields: { name?: string; sex?: 'doe' | 'buck'; sireId?: string; damId?: string; breedId?: string; birthDate?: string } = {}) {
  connectDatabase(process.env.DATABASE_URL!);
  return addAnimalAs(person, { sex: 'doe', name: `Juniper ${randomUUID().slice(0, 4)}`, birthDate: '2025-06-01', ...fields });
}

export function listingBody(overrides: Partial<SwapListingBody> = {}): SwapListingBody {
  return {
    kind: 'breeding_stock', title: 'Junior doe, good mothering line', description: 'Calm, eats well.', priceMode: 'price', priceCents: 6_500,
    collectPlace: 'Farm gate, Saturdays', validUntil: inDays(30), ...overrides,
  };
}

/** Lists through the service as `person` (open on the board unless `publish: false`). */
export async function listAs(person: TestPerson, overrides: Partial<SwapListingBody> = {}): Promise<SwapListingDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return (await createListing(actorOf(person), swapListingSchema.parse(listingBody(overrides)))).listing;
}

/** A breeding-stock listing of one new doe of the person's farm. */
export async function listedDoe(person: TestPerson, overrides: Partial<SwapListingBody> = {}, fields: Parameters<typeof stockOf>[1] = {}) {
  const doe = await stockOf(person, fields);
  const listing = await listAs(person, { animalIds: [doe.id], ...overrides });
  return { doe, listing };
}

export async function offerAs(person: TestPerson, listingId: string, overrides: Partial<SwapOfferBody> = {}): Promise<SwapOfferDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return (await makeOffer(actorOf(person), swapOfferSchema.parse({ listingId, priceCents: 6_000, validUntil: inDays(10), ...overrides }))).offer;
}

/** The Ledger transfers of an offer's sale, as stored. */
export async function saleTransfersOf(coopId: string, offerId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    `SELECT id, status, kind, amount_cents::int AS amount_cents FROM ledger_transfers WHERE source_type = 'swap_offer' AND source_id = $1 ORDER BY id`,
    [offerId],
  )).rows as { id: string; status: string; kind: string; amount_cents: number }[]);
}

/** Where an animal stands, as stored. */
export async function custodyOf(coopId: string, animalId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    'SELECT owning_farm_id, keeping_farm_id, breeding_farm_id, sire_id, dam_id, notes FROM animals WHERE id = $1',
    [animalId],
  )).rows[0] as { owning_farm_id: string; keeping_farm_id: string; breeding_farm_id: string | null; sire_id: string | null; dam_id: string | null; notes: string });
}

/** Rows of the Swap Board's tables and the animals' moves of a co-op, for "a refused request changed nothing" checks. */
export async function swapCounts(coopId: string) {
  return asTenant(coopId, async (c) => {
    const count = async (sql: string) => (await c.query(sql, [coopId])).rows[0].n as number;
    return {
      listings: await count('SELECT count(*)::int AS n FROM swap_listings WHERE coop_id = $1'),
      listingVersions: await count('SELECT coalesce(sum(version), 0)::int AS n FROM swap_listings WHERE coop_id = $1'),
      offers: await count('SELECT count(*)::int AS n FROM swap_offers WHERE coop_id = $1'),
      offerVersions: await count('SELECT coalesce(sum(version), 0)::int AS n FROM swap_offers WHERE coop_id = $1'),
      moves: await count('SELECT count(*)::int AS n FROM animal_custody_events WHERE coop_id = $1'),
      transfers: await count(`SELECT count(*)::int AS n FROM ledger_transfers WHERE coop_id = $1 AND source_type = 'swap_offer'`),
    };
  });
}

/** An animal's arrival quarantines on the Almanac, as stored: on which farm, from and to. */
export async function quarantinesOf(coopId: string, animalId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    `SELECT farm_id, window_start::text AS window_start, due_on::text AS due_on FROM almanac_tasks
      WHERE animal_id = $1 AND kind = 'quarantine_end' ORDER BY created_at`,
    [animalId],
  )).rows as { farm_id: string; window_start: string; due_on: string }[]);
}
