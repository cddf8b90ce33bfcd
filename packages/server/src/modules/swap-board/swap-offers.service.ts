import type { Transaction } from 'sequelize';
import {
  ErrorCode, type SwapAcceptInput, type SwapCounterInput, type SwapOfferDto, type SwapOfferInput, type SwapOfferListDto, type SwapOfferListQuery,
  type SwapReasonInput, type SwapVersionInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { moveAnimalInTransaction } from '../animals/custody-moves.service';
import { authorize, farmOf, hasMessages, mergeMessages, type FieldMessages } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { sellHeadsIn } from '../grow-out/grow-out.service';
import { postPending, postTransfer, voidPending } from '../ledger/ledger.service';
import { swapContextFor } from './swap-board-context';
import { presentOffer, sideOf } from './swap-board.presenter';
import { eventsOfOffers, listingById, OFFER_COLUMNS, offerById, rows, type ListingRow, type OfferRow } from './swap-board-queries';
import { closeOpenOffers, listingLink, recordOfferEvent, setListingState, stockRefusals, tell } from './swap-board-steps';

const saleTransferId = (offerId: string) => `swap:${offerId}:sale`;
const money = (cents: number | null) => (cents === null ? null : `$${(cents / 100).toFixed(2)}`);

function termsInWords(priceCents: number | null, tradeCount: number): string {
  const parts = [money(priceCents), tradeCount > 0 ? `${tradeCount} animal${tradeCount === 1 ? '' : 's'} in trade` : null].filter(Boolean);
  return parts.join(' and ');
}

/**
 * An offer the actor's farm is party to (seller or buyer; their apprentices follow it). For anyone else,
 * the admin included, it does not exist (404); a party who may not act on it gets 403.
 */
async function offerFor(tx: Transaction, actor: SessionUser, offerId: string, action: 'read' | 'update', lock = false): Promise<OfferRow> {
  const offer = await offerById(tx, offerId, lock);
  if (!offer || !actor.farmId || (actor.farmId !== offer.seller_farm_id && actor.farmId !== offer.buyer_farm_id)) throw AppError.notFound('That offer');
  authorize(
    actor,
    action,
    { subject: 'Trade', fields: { farmId: actor.farmId }, farmIds: [offer.seller_farm_id, offer.buyer_farm_id], what: 'That offer' },
    'Only the members of the two farms act on an offer; apprentices follow it',
  );
  return offer;
}

async function answer(tx: Transaction, actor: SessionUser, offerId: string): Promise<SwapOfferDto> {
  return (await presentOffers(tx, actor, [(await offerById(tx, offerId))!]))[0]!;
}

async function presentOffers(tx: Transaction, actor: SessionUser, offers: OfferRow[]): Promise<SwapOfferDto[]> {
  if (offers.length === 0) return [];
  const events = await eventsOfOffers(tx, offers.map((o) => o.id));
  const ctx = await swapContextFor(tx, actor, [], offers);
  return offers.map((o) => presentOffer(o, events.filter((e) => e.offer_id === o.id), ctx));
}

async function todayOf(tx: Transaction, actor: SessionUser, farmId: string): Promise<string> {
  return farmTodayIn(await farmDirectoryOf(actor.coopId, tx), farmId);
}

function checkTerms(errors: FieldMessages, input: { validUntil: string }, listing: ListingRow, today: string): void {
  if (input.validUntil < today) errors.validUntil = ['Choose a day from today on'];
  else if (input.validUntil > listing.valid_until) errors.validUntil = [`The listing is up until ${listing.valid_until}; let the offer stand until then at most`];
}

/** After an offer closes: a listing with no open offer left is open again. */
async function reopenWhenNoOffers(tx: Transaction, listingId: string): Promise<void> {
  const listing = await listingById(tx, listingId, true);
  if (listing && listing.state === 'under_offer' && listing.open_offers === 0) await setListingState(tx, listing, 'open');
}

/**
 * A member offers on another farm's listing: a price, animals of the farm's herd in trade, or both, with
 * a message and how long the offer stands. The seller is told at once. The client's id is the offer's
 * idempotency key: the same id again answers the original offer.
 */
export async function makeOffer(actor: SessionUser, input: SwapOfferInput): Promise<{ offer: SwapOfferDto; created: boolean }> {
  return withTenant(actor, async (tx) => {
    const buyerFarmId = farmOf(actor, 'Only a member of a farm makes offers');
    if (input.id) {
      const existing = await offerById(tx, input.id);
      if (existing) {
        if (existing.created_by !== actor.id) throw AppError.idTaken();
        return { offer: await answer(tx, actor, existing.id), created: false };
      }
    }
    const listing = await listingById(tx, input.listingId, true);
    if (!listing || listing.state === 'draft') throw AppError.notFound('That listing');
    authorize(actor, 'create', { subject: 'Trade', fields: { farmId: buyerFarmId }, farmIds: [], what: 'That listing', knownToCoop: true }, 'Apprentices follow the Swap Board; only members make offers');
    if (listing.farm_id === buyerFarmId) throw new AppError(ErrorCode.forbidden, 403, 'This is your own farm\'s listing');
    if (listing.kind === 'wanted') throw AppError.conflict('A wanted post takes no offers: list the animal and tell the member in the listing\'s thread');
    if (listing.state !== 'open' && listing.state !== 'under_offer') throw AppError.conflict(`This listing is ${listing.state}; it takes no more offers`);
    const today = await todayOf(tx, actor, buyerFarmId);
    const errors: FieldMessages = {};
    checkTerms(errors, input, listing, today);
    if (new Set(input.tradeAnimalIds).size !== input.tradeAnimalIds.length) errors.tradeAnimalIds = ['Name each animal once'];
    mergeMessages(errors, await stockRefusals(tx, actor, buyerFarmId, input.tradeAnimalIds, today, 'tradeAnimalIds'));
    if (hasMessages(errors)) throw AppError.validation(errors);

    const [created] = await rows<{ id: string }>(
      tx,
      `INSERT INTO swap_offers (id, coop_id, listing_id, seller_farm_id, buyer_farm_id, price_cents, trade_animal_ids, message, valid_until, created_by)
       VALUES (coalesce($1::uuid, gen_random_uuid()), $2, $3, $4, $5, $6, $7::uuid[], $8, $9, $10) RETURNING id`,
      [input.id ?? null, actor.coopId, listing.id, listing.farm_id, buyerFarmId, input.priceCents, input.tradeAnimalIds, input.message, input.validUntil, actor.id],
    );
    const offer = (await offerById(tx, created!.id))!;
    const terms = termsInWords(input.priceCents, input.tradeAnimalIds.length);
    await recordOfferEvent(tx, actor, offer, 'open', {
      kind: 'offered', text: `Offered ${terms}${input.message ? `: “${input.message}”` : ''}`, priceCents: input.priceCents, tradeAnimalIds: input.tradeAnimalIds,
    });
    if (listing.state === 'open') await setListingState(tx, listing, 'under_offer');
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [listing.farm_id], kind: 'swap.offer', key: `swap-offer:${offer.id}`,
      title: `${actor.name} offers ${terms} for “${listing.title}”`, link: listingLink(listing.id),
    });
    return { offer: await answer(tx, actor, offer.id), created: true };
  });
}

function requireTurn(actor: SessionUser, offer: OfferRow, what: string): void {
  if (offer.state !== 'open') throw AppError.conflict(`This offer is ${offer.state}; it cannot be ${what} now`);
  if (offer.awaiting !== sideOf(actor, offer)) throw new AppError(ErrorCode.forbidden, 403, `The other farm answers this offer now; it cannot be ${what} by your farm`);
}

/** The side whose turn it is answers with new terms; the other side answers next. */
export async function counterOffer(actor: SessionUser, offerId: string, input: SwapCounterInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const offer = await offerFor(tx, actor, offerId, 'update', true);
    requireTurn(actor, offer, 'countered');
    if (offer.version !== input.version) throw AppError.staleVersion();
    const listing = (await listingById(tx, offer.listing_id))!;
    const side = sideOf(actor, offer);
    const errors: FieldMessages = {};
    checkTerms(errors, input, listing, await todayOf(tx, actor, actor.farmId!));
    // The trade animals are always the buyer's: checked against the buyer's farm whichever side counters.
    mergeMessages(errors, await stockRefusals(tx, actor, offer.buyer_farm_id, input.tradeAnimalIds, await todayOf(tx, actor, offer.buyer_farm_id), 'tradeAnimalIds'));
    if (hasMessages(errors)) throw AppError.validation(errors);
    await rows(
      tx,
      `UPDATE swap_offers SET price_cents = $2, trade_animal_ids = $3::uuid[], message = $4, valid_until = $5, awaiting = $6,
         version = version + 1, updated_at = now() WHERE id = $1`,
      [offer.id, input.priceCents, input.tradeAnimalIds, input.message, input.validUntil, side === 'seller' ? 'buyer' : 'seller'],
    );
    const terms = termsInWords(input.priceCents, input.tradeAnimalIds.length);
    await recordOfferEvent(tx, actor, offer, 'open', {
      kind: 'countered', text: `Countered with ${terms}${input.message ? `: “${input.message}”` : ''}`, priceCents: input.priceCents, tradeAnimalIds: input.tradeAnimalIds,
    });
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [side === 'seller' ? offer.buyer_farm_id : offer.seller_farm_id], kind: side === 'seller' ? 'swap.answered' : 'swap.offer',
      key: `swap-counter:${offer.id}:${offer.version + 1}`, title: `${actor.name} counters with ${terms} on “${listing.title}”`, link: listingLink(listing.id),
    });
    return answer(tx, actor, offer.id);
  });
}

/** The side whose turn it is declines, with a reason the other reads. */
export async function declineOffer(actor: SessionUser, offerId: string, input: SwapReasonInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const offer = await offerFor(tx, actor, offerId, 'update', true);
    requireTurn(actor, offer, 'declined');
    if (offer.version !== input.version) throw AppError.staleVersion();
    const side = sideOf(actor, offer);
    await rows(tx, `UPDATE swap_offers SET state = 'declined', closed_reason = $2, version = version + 1, updated_at = now() WHERE id = $1`, [offer.id, input.reason || null]);
    await recordOfferEvent(tx, actor, offer, 'declined', { kind: 'declined', text: `Declined${input.reason ? `: ${input.reason}` : ''}` });
    await reopenWhenNoOffers(tx, offer.listing_id);
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [side === 'seller' ? offer.buyer_farm_id : offer.seller_farm_id], kind: 'swap.answered', key: `swap-declined:${offer.id}`,
      title: `${actor.name} declines the offer on “${offer.listing_title}”${input.reason ? `: ${input.reason}` : ''}`, link: listingLink(offer.listing_id),
    });
    return answer(tx, actor, offer.id);
  });
}

/** The buyer withdraws an open offer. */
export async function withdrawOffer(actor: SessionUser, offerId: string, input: SwapReasonInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const offer = await offerFor(tx, actor, offerId, 'update', true);
    if (sideOf(actor, offer) !== 'buyer') throw new AppError(ErrorCode.forbidden, 403, 'The farm that made the offer withdraws it; the seller declines it');
    if (offer.state !== 'open') throw AppError.conflict(`This offer is ${offer.state}; it cannot be withdrawn now`);
    if (offer.version !== input.version) throw AppError.staleVersion();
    await rows(tx, `UPDATE swap_offers SET state = 'withdrawn', closed_reason = $2, version = version + 1, updated_at = now() WHERE id = $1`, [offer.id, input.reason || null]);
    await recordOfferEvent(tx, actor, offer, 'withdrawn', { kind: 'withdrawn', text: `Withdrawn${input.reason ? `: ${input.reason}` : ''}` });
    await reopenWhenNoOffers(tx, offer.listing_id);
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [offer.seller_farm_id], kind: 'swap.offer', key: `swap-withdrawn:${offer.id}`,
      title: `${actor.name} withdraws the offer on “${offer.listing_title}”`, link: listingLink(offer.listing_id),
    });
    return answer(tx, actor, offer.id);
  });
}

/**
 * Accepting is one transaction: the listed animals (and any traded ones) are locked in one order, the
 * listing and the offer after them; the animals change owning and keeping farm through the custody
 * history (the seller stays the breeding farm; pedigree, COI, weights and photos travel, the seller's
 * private notes do not), the Almanac plans each arrival's quarantine, the listing is sold, the other
 * offers are declined with a notice, and the price goes to the Ledger as pending until the buyer
 * confirms the collection. Concurrent accepts on one listing, or of one animal listed twice: the first
 * wins, the others answer 409. The same key again answers the accepted offer.
 */
export async function acceptOffer(actor: SessionUser, offerId: string, input: SwapAcceptInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const seen = await offerFor(tx, actor, offerId, 'update');
    if (seen.accept_key === input.key) return answer(tx, actor, seen.id);
    const seenListing = (await listingById(tx, seen.listing_id))!;
    const animalIds = [...seenListing.animal_ids, ...seen.trade_animal_ids];
    // Animals first, in one order: two listings of one animal, or trades crossing, never wait on each other in a circle.
    if (animalIds.length > 0) await rows(tx, 'SELECT id FROM animals WHERE id = ANY($1::uuid[]) ORDER BY id FOR UPDATE', [animalIds]);
    const listing = (await listingById(tx, seen.listing_id, true))!;
    const offer = (await offerById(tx, offerId, true))!;
    if (offer.accept_key === input.key) return answer(tx, actor, offer.id);
    if (listing.state === 'sold') throw AppError.conflict(`“${listing.title}” is sold already: another offer was accepted first`);
    if (listing.state !== 'open' && listing.state !== 'under_offer') throw AppError.conflict(`“${listing.title}” is ${listing.state}; no offer can be accepted`);
    requireTurn(actor, offer, 'accepted');
    if (offer.version !== input.version) throw AppError.staleVersion();
    const today = await todayOf(tx, actor, listing.farm_id);
    if (offer.valid_until < today) throw AppError.conflict(`This offer stood until ${offer.valid_until}; ask for a new one`);
    const gone: FieldMessages = {};
    mergeMessages(gone, await stockRefusals(tx, actor, listing.farm_id, listing.animal_ids, today, 'animalIds'));
    mergeMessages(gone, await stockRefusals(tx, actor, offer.buyer_farm_id, offer.trade_animal_ids, today, 'tradeAnimalIds'));
    if (hasMessages(gone)) {
      throw AppError.conflict('Some animals can no longer change hands (sold elsewhere, treated, lent or in quarantine); nothing was moved', gone);
    }

    // Grow-out heads leave their group in this transaction: refused (409) when the group has fewer left.
    if (listing.kind === 'grow_out' && listing.group_id && listing.head_count) {
      await sellHeadsIn(tx, actor, { farmId: listing.farm_id, groupId: listing.group_id, soldOn: today, headCount: listing.head_count, sourceId: offer.id });
    }
    await rows(
      tx,
      `UPDATE swap_offers SET state = 'accepted', accepted_on = $2, accept_key = $3, version = version + 1, updated_at = now() WHERE id = $1`,
      [offer.id, today, input.key],
    );
    await setListingState(tx, listing, 'sold', `Sold on ${today}`);
    await closeOpenOffers(tx, actor, listing, 'declined', 'Another offer was accepted', offer.id);
    const note = `Swap Board: ${listing.title}`;
    for (const id of listing.animal_ids) {
      await moveAnimalInTransaction(tx, actor, id, { kind: 'transferred', toFarmId: offer.buyer_farm_id, movedOn: today, note }, { notesStay: true });
    }
    for (const id of offer.trade_animal_ids) {
      await moveAnimalInTransaction(tx, actor, id, { kind: 'transferred', toFarmId: offer.seller_farm_id, movedOn: today, note: `${note} (in trade)` }, { notesStay: true });
    }
    if (offer.price_cents && offer.price_cents > 0) {
      await postTransfer(tx, {
        id: saleTransferId(offer.id), kind: 'sale', debit: { farmId: offer.buyer_farm_id }, credit: { farmId: offer.seller_farm_id },
        amountCents: offer.price_cents, pending: true, sourceType: 'swap_offer', sourceId: offer.id, memo: `Swap Board sale: ${listing.title}`, postedBy: actor.id,
      });
    }
    const terms = termsInWords(offer.price_cents, offer.trade_animal_ids.length);
    await recordOfferEvent(tx, actor, offer, 'accepted', { kind: 'accepted', text: `Accepted ${terms}`, priceCents: offer.price_cents, tradeAnimalIds: offer.trade_animal_ids });
    const other = sideOf(actor, offer) === 'seller' ? offer.buyer_farm_id : offer.seller_farm_id;
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [other], kind: 'swap.answered', key: `swap-accepted:${offer.id}`,
      title: `${actor.name} accepts ${terms} for “${listing.title}”`, link: listingLink(listing.id),
      text: 'The animals are now in the buyer\'s herd with their pedigree, and their arrival quarantine is on the Almanac. '
        + 'Both farms download each animal\'s pedigree certificate from the sold listing. The buyer confirms the collection on the listing; the sale is then posted to the Ledger.',
    });
    return answer(tx, actor, offer.id);
  });
}

/** The buyer confirms the animals were collected: the pending sale is posted. */
export async function confirmCollection(actor: SessionUser, offerId: string, input: SwapVersionInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const offer = await offerFor(tx, actor, offerId, 'update', true);
    if (sideOf(actor, offer) !== 'buyer') throw new AppError(ErrorCode.forbidden, 403, 'The buyer confirms the collection');
    if (offer.state !== 'accepted') throw AppError.conflict(`This offer is ${offer.state}; there is no collection to confirm`);
    if (offer.version !== input.version) throw AppError.staleVersion();
    await rows(tx, `UPDATE swap_offers SET state = 'collected', version = version + 1, updated_at = now() WHERE id = $1`, [offer.id]);
    if (offer.price_cents && offer.price_cents > 0) await postPending(tx, saleTransferId(offer.id), actor.id);
    await recordOfferEvent(tx, actor, offer, 'collected', { kind: 'collected', text: 'Confirmed the collection' });
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [offer.seller_farm_id], kind: 'swap.answered', key: `swap-collected:${offer.id}`,
      title: `${actor.name} confirms collecting “${offer.listing_title}”`, link: listingLink(offer.listing_id),
    });
    return answer(tx, actor, offer.id);
  });
}

/**
 * Either farm reports that the hand-over failed before the collection was confirmed: the pending sale
 * is voided and the animals go back to their farms through the custody history.
 */
export async function reportHandOverFailed(actor: SessionUser, offerId: string, input: SwapReasonInput): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => {
    const offer = await offerFor(tx, actor, offerId, 'update', true);
    if (offer.state !== 'accepted') throw AppError.conflict(`This offer is ${offer.state}; only an accepted sale awaiting collection can fail`);
    if (offer.version !== input.version) throw AppError.staleVersion();
    const listing = (await listingById(tx, offer.listing_id, true))!;
    const today = await todayOf(tx, actor, actor.farmId!);
    const reason = input.reason || 'The hand-over did not happen';
    await rows(tx, `UPDATE swap_offers SET state = 'failed', closed_reason = $2, version = version + 1, updated_at = now() WHERE id = $1`, [offer.id, reason]);
    if (offer.price_cents && offer.price_cents > 0) await voidPending(tx, saleTransferId(offer.id));
    const note = `Swap Board hand-over failed: ${listing.title}`;
    for (const id of listing.animal_ids) await moveAnimalInTransaction(tx, actor, id, { kind: 'transferred', toFarmId: offer.seller_farm_id, movedOn: today, note });
    for (const id of offer.trade_animal_ids) await moveAnimalInTransaction(tx, actor, id, { kind: 'transferred', toFarmId: offer.buyer_farm_id, movedOn: today, note });
    await setListingState(tx, listing, 'withdrawn', `The hand-over failed: ${reason}`);
    await recordOfferEvent(tx, actor, offer, 'failed', { kind: 'failed', text: `The hand-over failed: ${reason}` });
    const other = sideOf(actor, offer) === 'seller' ? offer.buyer_farm_id : offer.seller_farm_id;
    await tell(tx, actor, {
      coopId: actor.coopId, farmIds: [other], kind: 'swap.answered', key: `swap-failed:${offer.id}`,
      title: `${actor.name} reports the hand-over of “${listing.title}” failed`, link: listingLink(listing.id),
    });
    return answer(tx, actor, offer.id);
  });
}

/** One offer with its thread, for its two farms. */
export async function getOffer(actor: SessionUser, offerId: string): Promise<SwapOfferDto> {
  return withTenant(actor, async (tx) => answer(tx, actor, (await offerFor(tx, actor, offerId, 'read')).id));
}

/** My farm's offers on others' listings (`made`) or the offers on my farm's listings (`received`), latest first. */
export async function listOffers(actor: SessionUser, q: SwapOfferListQuery): Promise<SwapOfferListDto> {
  const farmId = farmOf(actor, 'Only the people of a farm follow its offers');
  return withTenant(actor, async (tx) => {
    const where = [q.side === 'made' ? 'o.buyer_farm_id = $1' : 'o.seller_farm_id = $1'];
    if (q.open) where.push(`o.state IN ('open', 'accepted')`);
    const clause = where.join(' AND ');
    const page = await rows<OfferRow>(
      tx,
      `SELECT ${OFFER_COLUMNS}, count(*) OVER () AS total_count FROM swap_offers o WHERE ${clause}
       ORDER BY o.updated_at DESC, o.id LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`,
      [farmId],
    );
    let total = page.length > 0 ? Number(page[0]!.total_count) : 0;
    if (page.length === 0 && q.page > 1) {
      const [count] = await rows<{ count: string }>(tx, `SELECT count(*) FROM swap_offers o WHERE ${clause}`, [farmId]);
      total = Number(count?.count ?? 0);
    }
    return { items: await presentOffers(tx, actor, page), total, page: q.page, pageSize: q.pageSize };
  });
}
