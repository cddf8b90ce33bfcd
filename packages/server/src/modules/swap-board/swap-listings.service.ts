import type { Transaction } from 'sequelize';
import {
  addDays, addMonths, daysBetween, defineAbilityFor, ErrorCode, MAX_LISTING_DAYS, subjectOf, type SwapBoardSummaryDto, type SwapListingDto, type SwapListingEditInput,
  type SwapListingInput, type SwapListingListDto, type SwapListingPageDto, type SwapListingQuery, type SwapReasonInput, type SwapVersionInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJobIn, handleJobs } from '../../lib/mail-outbox';
import type { SessionUser } from '../../lib/session-user';
import type { OwnershipEnd } from '../animals/custody-moves.service';
import { breedMapOf } from '../breeds/breeds.service';
import { authorize, farmOf, hasMessages, type FieldMessages } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { groupOfFarm } from '../grow-out/grow-out-facts.service';
import { announceListing, swapContextFor } from './swap-board-context';
import { presentListing, presentOffer } from './swap-board.presenter';
import { eventsOfOffers, LISTING_COLUMNS, listingById, OFFER_COLUMNS, rows, type ListingRow, type OfferRow } from './swap-board-queries';
import { closeOpenOffers, requireListingState, setListingState, stockRefusals } from './swap-board-steps';

/** The queue of the listing-expiry job (created by migration 0102). */
export const SWAP_EXPIRY_QUEUE = 'swap-listing-expiry';

const LIVE = `l.state IN ('open', 'under_offer')`;

/**
 * A listing the actor may read: a draft only its own farm sees; the rest of the board is the co-op's.
 * Another co-op's (or a draft of another farm) does not exist for the actor (404).
 */
async function listingFor(tx: Transaction, actor: SessionUser, listingId: string, action: 'read' | 'update', lock = false): Promise<ListingRow> {
  const listing = await listingById(tx, listingId, lock);
  if (!listing || (listing.state === 'draft' && listing.farm_id !== actor.farmId)) throw AppError.notFound('That listing');
  authorize(
    actor,
    action,
    { subject: 'Trade', fields: { farmId: listing.farm_id }, farmIds: [listing.farm_id], what: 'That listing', knownToCoop: true },
    'Only the members of the listing farm change its listing; apprentices follow it',
  );
  return listing;
}

async function present(tx: Transaction, actor: SessionUser, listings: ListingRow[], mateWith: string | null = null): Promise<SwapListingDto[]> {
  const ctx = await swapContextFor(tx, actor, listings, [], mateWith);
  return listings.map((l) => presentListing(l, ctx));
}

/** Photos of the listing must be the farm's own, of a listed animal, and not deleted. */
async function photoRefusals(tx: Transaction, farmId: string, photoIds: string[], animalIds: string[]): Promise<FieldMessages> {
  const errors: FieldMessages = {};
  if (photoIds.length === 0) return errors;
  const found = await rows<{ id: string }>(
    tx,
    'SELECT id FROM photos WHERE id = ANY($1::uuid[]) AND farm_id = $2 AND animal_id = ANY($3::uuid[]) AND deleted_at IS NULL',
    [photoIds, farmId, animalIds],
  );
  const ok = new Set(found.map((p) => p.id));
  photoIds.forEach((id, i) => {
    if (!ok.has(id)) errors[`photoIds.${i}`] = ['Pick a photo your farm took of a listed animal'];
  });
  return errors;
}

function validUntilRefusals(validUntil: string, today: string): FieldMessages {
  if (validUntil < today) return { validUntil: ['Choose a day from today on'] };
  if (daysBetween(today, validUntil) > MAX_LISTING_DAYS) return { validUntil: [`Keep a listing up ${MAX_LISTING_DAYS} days at most; list it again later`] };
  return {};
}

async function checkListing(tx: Transaction, actor: SessionUser, farmId: string, input: SwapListingInput, today: string): Promise<FieldMessages> {
  const errors: FieldMessages = validUntilRefusals(input.validUntil, today);
  if (input.kind === 'breeding_stock') Object.assign(errors, await stockRefusals(tx, actor, farmId, input.animalIds, today, 'animalIds'));
  if (input.kind === 'grow_out' && input.groupId) {
    const group = await groupOfFarm(tx, actor.coopId, farmId, input.groupId);
    if (!group) errors.groupId = ['Choose one of your farm\'s grow-out groups'];
    else if (group.status !== 'growing') errors.groupId = [`${group.name} is closed; choose a growing group`];
  }
  Object.assign(errors, await photoRefusals(tx, farmId, input.photoIds, input.animalIds));
  if (input.wantedBreedId && !(await breedMapOf(actor.coopId, tx)).has(input.wantedBreedId)) errors.wantedBreedId = ['Choose a breed from the list'];
  return errors;
}

async function queueExpiry(tx: Transaction, listing: Pick<ListingRow, 'coop_id' | 'id' | 'valid_until'>): Promise<void> {
  await enqueueJobIn(tx, SWAP_EXPIRY_QUEUE, { coopId: listing.coop_id, listingId: listing.id }, { startAfter: new Date(`${addDays(listing.valid_until, 1)}T12:00:00Z`) });
}

/**
 * Lists breeding stock, grow-out or a wanted post for the actor's farm: a draft, or open on the board at
 * once. Animals that may not change hands are refused with the reason. A repeated client id answers the
 * original listing.
 */
export async function createListing(actor: SessionUser, input: SwapListingInput): Promise<{ listing: SwapListingDto; created: boolean }> {
  return withTenant(actor, async (tx) => {
    const farmId = farmOf(actor, 'Only a member of a farm lists on the Swap Board');
    authorize(actor, 'create', { subject: 'Trade', fields: { farmId }, farmIds: [farmId], what: 'That listing', knownToCoop: true }, 'Apprentices follow the Swap Board; their mentor lists');
    if (input.id) {
      const existing = await listingById(tx, input.id);
      if (existing) {
        if (existing.created_by !== actor.id) throw AppError.idTaken();
        return { listing: (await present(tx, actor, [existing]))[0]!, created: false };
      }
    }
    const today = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), farmId);
    const errors = await checkListing(tx, actor, farmId, input, today);
    if (hasMessages(errors)) throw AppError.validation(errors);
    const state = input.publish ? 'open' : 'draft';
    const [created] = await rows<{ id: string }>(
      tx,
      `INSERT INTO swap_listings (id, coop_id, farm_id, kind, state, title, description, price_mode, price_cents, collect_place, valid_until,
         animal_ids, photo_ids, share_weights, group_id, head_count, ready_on, wanted_breed_id, wanted_sex, wanted_age, wanted_by, created_by)
       VALUES (coalesce($1::uuid, gen_random_uuid()), $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12::uuid[], $13::uuid[], $14, $15, $16, $17, $18, $19, $20, $21, $22)
       RETURNING id`,
      [input.id ?? null, actor.coopId, farmId, input.kind, state, input.title, input.description, input.priceMode, input.priceCents, input.collectPlace,
        input.validUntil, input.animalIds, input.photoIds, input.shareWeights, input.groupId, input.headCount, input.readyOn, input.wantedBreedId,
        input.wantedSex, input.wantedAge, input.wantedBy, actor.id],
    );
    const listing = (await listingById(tx, created!.id))!;
    if (state === 'open') await queueExpiry(tx, listing);
    announceListing(tx, listing, state);
    return { listing: (await present(tx, actor, [listing]))[0]!, created: true };
  });
}

/** Opens a draft on the board (its animals are checked again: they may have been treated or lent since). */
export async function publishListing(actor: SessionUser, listingId: string, input: SwapVersionInput): Promise<SwapListingDto> {
  return withTenant(actor, async (tx) => {
    const listing = await listingFor(tx, actor, listingId, 'update', true);
    if (listing.version !== input.version) throw AppError.staleVersion();
    requireListingState(listing, ['draft'], `This listing is ${listing.state.replace('_', ' ')}; only a draft is published`);
    const today = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), listing.farm_id);
    const errors: FieldMessages = {};
    if (listing.valid_until < today) errors.version = [`It was valid until ${listing.valid_until}; list it again with a later day`];
    Object.assign(errors, await stockRefusals(tx, actor, listing.farm_id, listing.animal_ids, today, 'animalIds'));
    if (hasMessages(errors)) throw AppError.validation(errors);
    await setListingState(tx, listing, 'open');
    await queueExpiry(tx, listing);
    return (await present(tx, actor, [(await listingById(tx, listing.id))!]))[0]!;
  });
}

/**
 * The seller edits a draft or open listing: title, notes, price and terms, last day and photos (of the
 * listed animals). Refused (409) once offers are open or it closed, or when another edit came first.
 */
export async function editListing(actor: SessionUser, listingId: string, input: SwapListingEditInput): Promise<SwapListingDto> {
  return withTenant(actor, async (tx) => {
    const listing = await listingFor(tx, actor, listingId, 'update', true);
    requireListingState(
      listing, ['draft', 'open'],
      listing.state === 'under_offer' ? 'Offers are open on this listing: answer them (or withdraw it) before changing its terms' : `This listing is ${listing.state}; it can no longer be changed`,
    );
    if (listing.version !== input.version) throw AppError.staleVersion();
    const today = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), listing.farm_id);
    const errors = validUntilRefusals(input.validUntil, today);
    Object.assign(errors, await photoRefusals(tx, listing.farm_id, input.photoIds, listing.animal_ids));
    if (hasMessages(errors)) throw AppError.validation(errors);
    await rows(
      tx,
      `UPDATE swap_listings SET title = $2, description = $3, price_mode = $4, price_cents = $5, collect_place = $6, valid_until = $7,
         photo_ids = $8::uuid[], version = version + 1, updated_at = now() WHERE id = $1`,
      [listing.id, input.title, input.description, input.priceMode, input.priceCents, input.collectPlace, input.validUntil, input.photoIds],
    );
    const edited = (await listingById(tx, listing.id))!;
    // An earlier last day needs its own expiry run; the old one finds a later day and waits again.
    if (edited.state === 'open' && edited.valid_until !== listing.valid_until) await queueExpiry(tx, edited);
    announceListing(tx, edited, edited.state);
    return (await present(tx, actor, [edited]))[0]!;
  });
}

/** The seller takes a listing off the board; open offers are declined with a notice. */
export async function withdrawListing(actor: SessionUser, listingId: string, input: SwapReasonInput): Promise<SwapListingDto> {
  return withTenant(actor, async (tx) => {
    const listing = await listingFor(tx, actor, listingId, 'update', true);
    if (listing.version !== input.version) throw AppError.staleVersion();
    requireListingState(listing, ['draft', 'open', 'under_offer'], `This listing is ${listing.state.replace('_', ' ')} already`);
    const reason = input.reason || 'The seller withdrew the listing';
    await setListingState(tx, listing, 'withdrawn', reason);
    await closeOpenOffers(tx, actor, listing, 'declined', reason);
    return (await present(tx, actor, [(await listingById(tx, listing.id))!]))[0]!;
  });
}

function mayReadBoard(actor: SessionUser): void {
  if (!defineAbilityFor(actor).can('read', subjectOf('Trade', { coopId: actor.coopId }))) {
    throw new AppError(ErrorCode.forbidden, 403, 'The Swap Board is for the co-op\'s people');
  }
}

/**
 * The board (open listings of the co-op) or the farm's own listings (`mine`, every state), filtered and
 * paged in SQL; pedigree completeness and the COI with one of my animals (`mateWith`) come from the
 * co-op's pedigree kept in memory, over the listings the SQL filters left.
 */
export async function listListings(actor: SessionUser, q: SwapListingQuery): Promise<SwapListingListDto> {
  mayReadBoard(actor);
  return withTenant(actor, async (tx) => {
    const bind: unknown[] = [actor.coopId];
    const param = (value: unknown) => {
      bind.push(value);
      return `$${bind.length}`;
    };
    const where = ['l.coop_id = $1'];
    if (q.mine) {
      const farmId = farmOf(actor, 'Only the people of a farm have listings');
      where.push(`l.farm_id = ${param(farmId)}`);
      if (q.state) where.push(`l.state = ${param(q.state)}`);
    } else {
      where.push(q.state && q.state !== 'draft' ? `l.state = ${param(q.state)}` : LIVE);
    }
    if (q.kind) where.push(`l.kind = ${param(q.kind)}`);
    // The board shows what is offered; wanted posts have their own tab (the farm's own list shows all).
    else if (!q.mine) where.push(`l.kind <> 'wanted'`);
    const first = '(SELECT a FROM animals a WHERE a.id = l.animal_ids[1])';
    if (q.sex) where.push(`(l.wanted_sex = ${param(q.sex)} OR ${first}.sex = $${bind.length})`);
    if (q.breedId) {
      const p = param(q.breedId);
      where.push(`(l.wanted_breed_id = ${p} OR EXISTS (SELECT 1 FROM animal_breed_makeups m WHERE m.animal_id = ANY(l.animal_ids) AND (m.breeds -> ${p}::text) IS NOT NULL))`);
    }
    if (q.minPriceCents !== undefined) where.push(`l.price_cents >= ${param(q.minPriceCents)}`);
    if (q.maxPriceCents !== undefined) where.push(`l.price_cents <= ${param(q.maxPriceCents)}`);
    const today = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), actor.farmId);
    if (q.minAgeMonths !== undefined) where.push(`${first}.birth_date <= ${param(addMonths(today, -q.minAgeMonths))}::date`);
    if (q.maxAgeMonths !== undefined) where.push(`${first}.birth_date > ${param(addMonths(today, -(q.maxAgeMonths + 1)))}::date`);
    if (q.search) {
      const p = param(`%${q.search.replace(/[\\%_]/g, '\\$&')}%`);
      where.push(`(l.title ILIKE ${p} OR l.description ILIKE ${p})`);
    }
    const clause = where.join(' AND ');
    const order = q.sort === 'price' ? 'l.price_cents ASC NULLS LAST, l.created_at DESC, l.id' : 'l.created_at DESC, l.id';
    const inMemory = q.minCompleteness !== undefined || q.maxCoi !== undefined || q.sort === 'coi';
    if (inMemory && !q.mateWith && (q.maxCoi !== undefined || q.sort === 'coi')) {
      throw AppError.validation({ mateWith: ['Choose one of your animals to compare the COI with'] });
    }
    const found = await rows<ListingRow>(
      tx,
      `SELECT ${LISTING_COLUMNS}, count(*) OVER () AS total_count FROM swap_listings l WHERE ${clause} ORDER BY ${order}
       ${inMemory ? '' : `LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`}`,
      bind,
    );
    const mateWith = q.mateWith ? await myAnimal(tx, actor, q.mateWith) : null;
    const ctx = await swapContextFor(tx, actor, found, [], mateWith);
    let items = found.map((l) => presentListing(l, ctx));
    let total = found.length > 0 ? Number(found[0]!.total_count) : 0;
    if (inMemory) {
      const bestCoi = (l: SwapListingDto) => Math.min(...l.animals.map((a) => a.trialCoi ?? 1), 1);
      if (q.minCompleteness !== undefined) items = items.filter((l) => l.animals.some((a) => a.completeness >= q.minCompleteness!));
      if (q.maxCoi !== undefined) items = items.filter((l) => l.animals.some((a) => a.trialCoi !== null && a.trialCoi <= q.maxCoi!));
      if (q.sort === 'coi') items = [...items].sort((a, b) => bestCoi(a) - bestCoi(b));
      total = items.length;
      items = items.slice((q.page - 1) * q.pageSize, q.page * q.pageSize);
    } else if (found.length === 0 && q.page > 1) {
      const [count] = await rows<{ count: string }>(tx, `SELECT count(*) FROM swap_listings l WHERE ${clause}`, bind);
      total = Number(count?.count ?? 0);
    }
    return { items, total, page: q.page, pageSize: q.pageSize };
  });
}

/** One of the actor's farm's animals, to compare listed animals with (another farm's is refused). */
async function myAnimal(tx: Transaction, actor: SessionUser, animalId: string): Promise<string> {
  const [row] = await rows<{ id: string }>(
    tx,
    'SELECT id FROM animals WHERE id = $1 AND deleted_at IS NULL AND (owning_farm_id = $2 OR keeping_farm_id = $2)',
    [animalId, actor.farmId],
  );
  if (!row) throw AppError.validation({ mateWith: ['Choose one of your farm\'s animals'] });
  return row.id;
}

/**
 * A listing with the offer thread the viewer's farm is party to: the seller's farm sees every offer,
 * a buyer's farm its own; apprentices follow them without prices.
 */
export async function getListingPage(actor: SessionUser, listingId: string): Promise<SwapListingPageDto> {
  mayReadBoard(actor);
  return withTenant(actor, async (tx) => {
    const listing = await listingFor(tx, actor, listingId, 'read');
    const offers = actor.farmId
      ? await rows<OfferRow>(
        tx,
        `SELECT ${OFFER_COLUMNS} FROM swap_offers o WHERE o.listing_id = $1 AND (o.seller_farm_id = $2 OR o.buyer_farm_id = $2) ORDER BY o.created_at, o.id`,
        [listing.id, actor.farmId],
      )
      : [];
    const events = await eventsOfOffers(tx, offers.map((o) => o.id));
    const ctx = await swapContextFor(tx, actor, [listing], offers);
    return {
      listing: presentListing(listing, ctx),
      offers: offers.map((o) => presentOffer(o, events.filter((e) => e.offer_id === o.id), ctx)),
    };
  });
}

/** The co-op hub's card: the board's counts and what waits for the actor's farm. */
export async function swapBoardSummary(actor: SessionUser): Promise<SwapBoardSummaryDto> {
  mayReadBoard(actor);
  return withTenant(actor, async (tx) => {
    const [row] = await rows<{ open: number; wanted: number; mine: number; awaiting: number }>(
      tx,
      `SELECT count(*) FILTER (WHERE ${LIVE} AND l.kind <> 'wanted')::int AS open,
              count(*) FILTER (WHERE ${LIVE} AND l.kind = 'wanted')::int AS wanted,
              count(*) FILTER (WHERE ${LIVE} AND l.farm_id = $2)::int AS mine,
              (SELECT count(*)::int FROM swap_offers o WHERE o.state = 'open'
                 AND ((o.awaiting = 'seller' AND o.seller_farm_id = $2) OR (o.awaiting = 'buyer' AND o.buyer_farm_id = $2))) AS awaiting
         FROM swap_listings l WHERE l.coop_id = $1`,
      [actor.coopId, actor.farmId],
    );
    return { openListings: row?.open ?? 0, wantedPosts: row?.wanted ?? 0, myOpenListings: row?.mine ?? 0, offersAwaitingMe: row?.awaiting ?? 0 };
  });
}

// ------------------------------------------------------------------------------------------------
// Closing by itself: an animal that left the farm, a listing past its last day
// ------------------------------------------------------------------------------------------------

/**
 * An animal that no longer belongs to the farm (sold through another listing or in the herd, died,
 * culled) closes the farm's live listings that hold it, declining their offers with a notice. Runs in
 * the transaction of the move (the herd calls it through its port).
 */
export async function closeListingsOfAnimal(tx: Transaction, end: OwnershipEnd): Promise<void> {
  const holding = await rows<ListingRow>(
    tx,
    `SELECT ${LISTING_COLUMNS} FROM swap_listings l
      WHERE l.farm_id = $1 AND $2::uuid = ANY(l.animal_ids) AND l.state IN ('draft', 'open', 'under_offer') ORDER BY l.id FOR UPDATE OF l`,
    [end.formerFarmId, end.animalId],
  );
  for (const listing of holding) {
    const reason = 'An animal of this listing no longer belongs to the farm (sold elsewhere or gone)';
    await setListingState(tx, listing, 'withdrawn', reason);
    await closeOpenOffers(tx, null, listing, 'declined', reason);
  }
}

export interface ExpiryJob {
  coopId: string;
  listingId: string;
}

/** Closes a listing past its last valid day on the seller's clock (checked again later when not yet). Safe to run twice. */
export async function expireListing(job: ExpiryJob, now: Date = new Date()): Promise<'expired' | 'not yet' | 'closed'> {
  return withTenant({ coopId: job.coopId }, async (tx) => {
    const listing = await listingById(tx, job.listingId, true);
    if (!listing || !['open', 'under_offer'].includes(listing.state)) return 'closed';
    const today = farmTodayIn(await farmDirectoryOf(job.coopId, tx), listing.farm_id, now);
    if (today <= listing.valid_until) {
      await enqueueJobIn(tx, SWAP_EXPIRY_QUEUE, job, { startAfter: new Date(now.getTime() + 6 * 3_600_000) });
      return 'not yet';
    }
    await setListingState(tx, listing, 'expired', `It was valid until ${listing.valid_until}`);
    await closeOpenOffers(tx, null, listing, 'expired', `The listing expired after ${listing.valid_until}`);
    return 'expired';
  });
}

handleJobs<ExpiryJob>(SWAP_EXPIRY_QUEUE, async (job) => {
  await expireListing(job);
});
