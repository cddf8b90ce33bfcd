/**
 * The Swap Board in the invented co-op: a few open listings (a junior doe for a price, a buck for trade, a
 * doe for offers with an offer waiting, fryers from a grow-out pen), a wanted post, one sale completed and
 * one trade completed. Everything goes through the services, so the animals that changed hands carry their
 * custody history, quarantine tasks and Ledger entries like any other.
 */
import { randomUUID } from 'node:crypto';
import {
  addDays, swapAcceptSchema, swapListingSchema, swapOfferSchema, swapVersionSchema, todayIn, type SwapListingBody,
} from '@burrowline/shared';
import { withTenant } from '../packages/server/src/db/tenant';
import { AppError } from '../packages/server/src/lib/app-error';
import type { SessionUser } from '../packages/server/src/lib/session-user';
import { findUserByEmail } from '../packages/server/src/modules/users/users.service';
import { rows } from '../packages/server/src/modules/swap-board/swap-board-queries';
import { createListing } from '../packages/server/src/modules/swap-board/swap-listings.service';
import { acceptOffer, confirmCollection, makeOffer } from '../packages/server/src/modules/swap-board/swap-offers.service';
import { demoFarms } from './demo-coop';

const ZONE = 'America/Chicago';

async function actorFor(coopId: string, farmKey: string): Promise<SessionUser> {
  const email = demoFarms.find((f) => f.key === farmKey)!.people[0]!.email;
  const user = await withTenant({ coopId }, (tx) => findUserByEmail(email, tx));
  return { id: user!.id, coopId, farmId: user!.farmId, mentorId: null, email: user!.email, name: user!.name, role: user!.role };
}

/**
 * The farm's own grown animals of a sex that are at home and not offered at stud, best candidates first.
 * The herd's story animals (a pedigree across farms, a litter preview with another farm's buck) stay put.
 */
async function candidatesOf(coopId: string, farmId: string, sex: 'doe' | 'buck', taken: Set<string>, grown = false): Promise<string[]> {
  const found = await withTenant({ coopId }, (tx) => rows<{ id: string }>(
    tx,
    `SELECT a.id FROM animals a
      WHERE a.owning_farm_id = $1 AND a.keeping_farm_id = $1 AND a.sex = $2 AND a.disposition = 'on_farm' AND a.deleted_at IS NULL
        AND a.lifecycle IN ('junior', 'breeding') AND NOT EXISTS (SELECT 1 FROM stud_offers o WHERE o.buck_id = a.id)
        AND a.name NOT IN ('Tobin', 'Clementine', 'Willowmere', 'Ardent''s Bramwell', 'Larkin')
      ORDER BY (a.lifecycle = $3) DESC, a.birth_date DESC NULLS LAST, a.id`,
    [farmId, sex, grown ? 'breeding' : 'junior'],
  ));
  return found.map((r) => r.id).filter((id) => !taken.has(id));
}

/**
 * Lists the first candidate the service accepts (one under a withdrawal or in quarantine is refused with
 * its reason; the next one is tried).
 */
async function listFirst(actor: SessionUser, candidates: string[], body: Omit<SwapListingBody, 'animalIds'>, taken: Set<string>) {
  for (const id of candidates) {
    try {
      const { listing } = await createListing(actor, swapListingSchema.parse({ ...body, animalIds: [id] }));
      taken.add(id);
      return listing;
    } catch (error) {
      if (!(error instanceof AppError) || error.status !== 400) throw error;
    }
  }
  return null;
}

/** Loads once: a co-op with any listing already has its Swap Board story. */
export async function loadDemoSwapBoard(coopId: string): Promise<void> {
  const listed = await withTenant({ coopId }, (tx) => rows(tx, 'SELECT id FROM swap_listings LIMIT 1'));
  if (listed.length > 0) return;
  const today = todayIn(ZONE);
  const actors = new Map<string, SessionUser>();
  for (const farm of demoFarms) actors.set(farm.key, await actorFor(coopId, farm.key));
  const at = (key: string) => actors.get(key)!;
  const taken = new Set<string>();
  const candidates = (key: string, sex: 'doe' | 'buck', grown = false) => candidatesOf(coopId, at(key).farmId!, sex, taken, grown);

  // A sale, completed: Quillfeather's doe to Hazelrun for $55, collected.
  const sold = await listFirst(at('quillfeather'), await candidates('quillfeather', 'doe', true), {
    kind: 'breeding_stock', title: 'Proven doe, steady litters of eight', description: 'Calm in the hand, a good nest builder. Moving her on to make room for her daughters.',
    priceMode: 'price', priceCents: 6_000, collectPlace: 'Quillfeather gate, any evening', validUntil: addDays(today, 20),
  }, taken);
  if (sold) {
    const { offer } = await makeOffer(at('hazelrun'), swapOfferSchema.parse({ id: randomUUID(), listingId: sold.id, priceCents: 5_500, message: 'Could collect on Saturday.', validUntil: addDays(today, 7) }));
    const accepted = await acceptOffer(at('quillfeather'), offer.id, swapAcceptSchema.parse({ version: offer.version, key: randomUUID() }));
    await confirmCollection(at('hazelrun'), offer.id, swapVersionSchema.parse({ version: accepted.version }));
  }

  // A trade, completed: Wrenfield's doe for one of Saltbush's bucks.
  const traded = await listFirst(at('wrenfield'), await candidates('wrenfield', 'doe'), {
    kind: 'breeding_stock', title: 'Junior doe for a trade', description: 'Looking to swap for a buck of another line.', priceMode: 'trade', validUntil: addDays(today, 30),
  }, taken);
  const tradeBuck = (await candidates('saltbush', 'buck', true))[0];
  if (traded && tradeBuck) {
    try {
      const { offer } = await makeOffer(at('saltbush'), swapOfferSchema.parse({ id: randomUUID(), listingId: traded.id, tradeAnimalIds: [tradeBuck], message: 'Our junior buck, from a different line.', validUntil: addDays(today, 7) }));
      taken.add(tradeBuck);
      const accepted = await acceptOffer(at('wrenfield'), offer.id, swapAcceptSchema.parse({ version: offer.version, key: randomUUID() }));
      await confirmCollection(at('saltbush'), offer.id, swapVersionSchema.parse({ version: accepted.version }));
    } catch (error) {
      // His own quarantine or a withdrawal may refuse him: the listing then stays open as a trade.
      if (!(error instanceof AppError) || error.status >= 500) throw error;
    }
  }

  // Open on the board: a junior doe for a price, a buck for trade, a doe for offers with an offer waiting.
  await listFirst(at('hazelrun'), await candidates('hazelrun', 'doe'), {
    kind: 'breeding_stock', title: 'Junior doe, Hazelrun line', description: 'Weighed every two weeks since weaning; her weights travel with her.',
    priceMode: 'price', priceCents: 6_500, collectPlace: 'Harrow feed store car park, Saturdays', validUntil: addDays(today, 28),
  }, taken);
  await listFirst(at('cobble-creek'), await candidates('cobble-creek', 'buck'), {
    kind: 'breeding_stock', title: 'Buck for trade, new blood for your line', priceMode: 'trade', collectPlace: 'Cobble Creek', validUntil: addDays(today, 21),
  }, taken);
  const forOffers = await listFirst(at('saltbush'), await candidates('saltbush', 'doe', true), {
    kind: 'breeding_stock', title: 'Senior doe, offers welcome', description: 'Retiring her from our program; still a fine mother.', priceMode: 'offers', validUntil: addDays(today, 14),
  }, taken);
  if (forOffers) {
    await makeOffer(at('quillfeather'), swapOfferSchema.parse({ id: randomUUID(), listingId: forOffers.id, priceCents: 4_000, message: 'Would she suit a first-time member?', validUntil: addDays(today, 10) }));
  }

  // Fryers from a growing pen, with the caution on selling meat.
  const [pen] = await withTenant({ coopId }, (tx) => rows<{ id: string; farm_id: string }>(
    tx, `SELECT id, farm_id FROM grow_out_groups WHERE status = 'growing' ORDER BY formed_on, id LIMIT 1`,
  ));
  const penFarm = pen ? [...actors.entries()].find(([, a]) => a.farmId === pen.farm_id)?.[1] : undefined;
  if (pen && penFarm) {
    await createListing(penFarm, swapListingSchema.parse({
      kind: 'grow_out', title: 'Fryers for a short processing day', description: 'For a member short of head on the next processing day.',
      priceMode: 'price', priceCents: 1_200, groupId: pen.id, headCount: 4, readyOn: addDays(today, 12), validUntil: addDays(today, 12),
    }));
  }

  // A wanted post.
  await createListing(at('cobble-creek'), swapListingSchema.parse({
    kind: 'wanted', title: 'Wanted: a proven doe to start a second line', description: 'Any meat breed with three generations of papers.',
    priceMode: 'offers', wantedSex: 'doe', wantedAge: 'senior', wantedBy: addDays(today, 45), validUntil: addDays(today, 45),
  }));
}
