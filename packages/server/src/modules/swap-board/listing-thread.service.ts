import { defineAbilityFor, subjectOf } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { subjectFromRows } from '../chat/chat-subjects.service';

interface ListingThreadRow {
  id: string;
  coop_id: string;
  farm_id: string;
  state: string;
  title: string;
  buyer_farm_ids: string[];
}

const listingsSql = (ids: string) =>
  `SELECT l.id, l.coop_id, l.farm_id, l.state, l.title,
          coalesce((SELECT array_agg(DISTINCT o.buyer_farm_id) FROM swap_offers o WHERE o.listing_id = l.id), '{}') AS buyer_farm_ids
     FROM swap_listings l WHERE l.id = ANY(${ids})`;

/** Who reads the listing reads its thread: the co-op, except a draft, which only its farm sees. */
const mayReadListing = (actor: SessionUser, listing: ListingThreadRow) =>
  (listing.state !== 'draft' || listing.farm_id === actor.farmId)
  && defineAbilityFor(actor).can('read', subjectOf('Trade', { coopId: listing.coop_id, farmId: listing.farm_id }));

/** A listing's thread: questions before an offer, arranging the collection after; the seller and the farms that offered are told. */
export const listingThreadSubject = subjectFromRows<ListingThreadRow>({
  rowsSql: listingsSql,
  mayRead: mayReadListing,
  participants: (_tx, listing) => ({ farmIds: [listing.farm_id, ...listing.buyer_farm_ids], userIds: [] }),
  title: (listing) => (listing ? `Swap Board: ${listing.title}` : 'A Swap Board listing'),
  link: (subjectId) => `/swap-board/listings/${subjectId}`,
});
