import { randomUUID } from 'node:crypto';
import { swapAcceptSchema } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { acceptOffer } from '../../packages/server/src/modules/swap-board/swap-offers.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { actorOf } from './herd';
import { inDays, listedDoe, offerAs } from './swap-board';

/**
 * Swap Board targets of the matrix: a farm-A doe listed (a draft, open with no offer, or open with farm B's
 * offer waiting for the seller), and that offer accepted (waiting for the collection).
 */
export const swapTargets = ['swapDraftA', 'swapOpenA', 'swapOfferedA', 'swapAcceptedA'] as const;
export type SwapTarget = (typeof swapTargets)[number];

export interface SwapIds {
  swapListingId?: string;
  swapListingVersion?: number;
  swapOfferId?: string;
  swapOfferVersion?: number;
}

/** Made fresh for every cell that may change it: a new doe and listing each time. */
export async function swapTarget(coop: TestCoop, target: string): Promise<SwapIds> {
  if (!(swapTargets as readonly string[]).includes(target)) return {};
  connectDatabase(process.env.DATABASE_URL!);
  const { listing } = await listedDoe(coop.member, { publish: target !== 'swapDraftA', title: 'Matrix doe' });
  if (target === 'swapDraftA' || target === 'swapOpenA') return { swapListingId: listing.id, swapListingVersion: listing.version };
  let offer = await offerAs(coop.otherFarmMember, listing.id, { priceCents: 2_500 });
  if (target === 'swapAcceptedA') offer = await acceptOffer(actorOf(coop.member), offer.id, swapAcceptSchema.parse({ version: offer.version, key: randomUUID() }));
  const [current] = (await asTenant(coop.id, (c) => c.query('SELECT version FROM swap_listings WHERE id = $1', [listing.id]))).rows;
  return { swapListingId: listing.id, swapListingVersion: current.version, swapOfferId: offer.id, swapOfferVersion: offer.version };
}

export function swapBody(body: string | undefined, ids: SwapIds): object | undefined {
  switch (body) {
    case 'swapWanted':
      return { kind: 'wanted', title: 'Wanted: a Rex buck', priceMode: 'offers', validUntil: inDays(20), wantedSex: 'buck' };
    case 'swapOffer':
      return { listingId: ids.swapListingId, priceCents: 3_000, validUntil: inDays(5) };
    case 'swapListingVersion':
      return { version: ids.swapListingVersion };
    case 'swapListingEdit':
      return { version: ids.swapListingVersion, title: 'Matrix doe, price lowered', priceMode: 'price', priceCents: 5_000, validUntil: inDays(20) };
    case 'swapListingReason':
      return { version: ids.swapListingVersion, reason: 'Checked by the authorization matrix' };
    case 'swapCounter':
      return { version: ids.swapOfferVersion, priceCents: 2_800, validUntil: inDays(5) };
    case 'swapAccept':
      return { version: ids.swapOfferVersion, key: randomUUID() };
    case 'swapOfferVersion':
      return { version: ids.swapOfferVersion };
    case 'swapOfferReason':
      return { version: ids.swapOfferVersion, reason: 'Checked by the authorization matrix' };
    default:
      return undefined;
  }
}

/** What a refused Swap Board call must leave as it was: listings, offers, the animals' moves and the sales. */
export async function swapStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    listings: (await c.query('SELECT id, state, version FROM swap_listings ORDER BY id')).rows,
    offers: (await c.query('SELECT id, state, version FROM swap_offers ORDER BY id')).rows,
    moves: (await c.query('SELECT count(*)::int AS n FROM animal_custody_events')).rows[0].n,
    sales: (await c.query(`SELECT id, status FROM ledger_transfers WHERE source_type = 'swap_offer' ORDER BY id`)).rows,
  }));
}
