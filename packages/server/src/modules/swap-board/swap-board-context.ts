import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms, type SwapListingState, type SwapOfferState } from '@burrowline/shared';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { coopPedigreeIn, pedigreeCardsIn } from '../animals/pedigree.service';
import { breedMapOf } from '../breeds/breeds.service';
import { canSeeMoney } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { crossLabelsOfGroups } from '../grow-out/grow-out-facts.service';
import type { SwapPresentContext } from './swap-board.presenter';
import { latestWeightsOf, type ListingRow, type OfferRow } from './swap-board-queries';

/** Whether the actor sees prices at all (apprentices never see money). */
export function seesPrices(actor: SessionUser): boolean {
  return canSeeMoney(actor, actor.farmId ?? '00000000-0000-0000-0000-000000000000');
}

/**
 * Everything presenting these listings and offers needs, read in a fixed number of statements whatever
 * their count: farms, breeds, the animals' cards, the co-op's pedigree (in memory), the sellers' latest
 * weights and the grow-out groups' labels.
 */
export async function swapContextFor(
  tx: Transaction,
  actor: SessionUser,
  listings: ListingRow[],
  offers: OfferRow[] = [],
  mateWith: string | null = null,
): Promise<SwapPresentContext> {
  const farms = await farmDirectoryOf(actor.coopId, tx);
  const breeds = await breedMapOf(actor.coopId, tx);
  const animalIds = [...listings.flatMap((l) => l.animal_ids), ...offers.flatMap((o) => o.trade_animal_ids), ...(mateWith ? [mateWith] : [])];
  const cards = await pedigreeCardsIn(tx, actor, animalIds);
  const pedigree = await coopPedigreeIn(tx, actor.coopId);
  const weights = await latestWeightsOf(tx, listings.filter((l) => l.share_weights).flatMap((l) => l.animal_ids.map((animalId) => ({ animalId, farmId: l.farm_id }))));
  const groupIds = listings.map((l) => l.group_id).filter((id): id is string => Boolean(id));
  const groups = await crossLabelsOfGroups(tx, actor.coopId, groupIds);
  const mine = mateWith ? cards.get(mateWith) : undefined;
  return {
    actor, farms, breeds, cards, pedigree, weights, groups,
    mateWith: mine ? { id: mine.card.id, sex: mine.sex } : null,
    seesPrices: seesPrices(actor),
    today: farmTodayIn(farms, actor.farmId),
  };
}

/** Listings are on the co-op's board: a change goes to the co-op room (no prices travel). */
export function announceListing(tx: Transaction, listing: Pick<ListingRow, 'id' | 'farm_id' | 'coop_id'>, state: SwapListingState): void {
  tx.afterCommit(() => publish(rooms.coop(listing.coop_id), RealtimeEvent.swapListingChanged, { listingId: listing.id, farmId: listing.farm_id, state }));
}

/** An offer's change goes to its two farms' rooms only. */
export function announceOffer(tx: Transaction, offer: Pick<OfferRow, 'id' | 'listing_id' | 'seller_farm_id' | 'buyer_farm_id'>, state: SwapOfferState): void {
  const farmIds = [offer.seller_farm_id, offer.buyer_farm_id];
  tx.afterCommit(() => {
    for (const farmId of farmIds) publish(rooms.farm(farmId), RealtimeEvent.swapOfferChanged, { offerId: offer.id, listingId: offer.listing_id, farmIds, state });
  });
}
