import type { Transaction } from 'sequelize';
import {
  ErrorCode, type BuckCardDto, type BuckCardListDto, type StudAvailabilityDto, type StudAvailabilityQuery, type StudBlockDto,
  type StudOfferInput, type StudOfferListQuery, type StudOfferUpdateInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { recordAudit, recordChanges } from '../audit/audit.service';
import { authorize, type FieldMessages } from '../farms/farm-access';
import { announceOffer, studContextFor } from './stud-share-context';
import { canManageOffer, presentBuckCard } from './stud-share.presenter';
import { emptyGetRecord, getRecordsOf, OFFER_COLUMNS, OFFER_EXTRAS, offerById, rows, type OfferRow } from './stud-share-queries';

/** The longest availability calendar asked at once. */
const MAX_CALENDAR_DAYS = 400;

/** Presents offers (one statement each for the cards and the get's records, whatever the count). */
export async function presentOffers(tx: Transaction, actor: SessionUser, offers: OfferRow[]): Promise<BuckCardDto[]> {
  if (offers.length === 0) return [];
  const ctx = await studContextFor(tx, actor, offers.map((o) => o.buck_id));
  const records = await getRecordsOf(tx, actor.coopId, offers.map((o) => o.buck_id));
  return offers.map((o) => {
    const found = records.get(o.buck_id);
    return presentBuckCard(o, ctx, found?.record ?? emptyGetRecord(), found?.littersAll ?? 0);
  });
}

/** An offer the actor may know of: an offered one (the co-op), or a withdrawn one of the actor's own farm. */
async function visibleOffer(tx: Transaction, actor: SessionUser, offerId: string, lock = false): Promise<OfferRow> {
  const offer = await offerById(tx, actor.coopId, offerId, lock);
  if (!offer || (offer.status !== 'offered' && actor.farmId !== offer.farm_id)) throw AppError.notFound('That offer');
  return offer;
}

function ensureManages(actor: SessionUser, farmId: string): void {
  authorize(
    actor,
    'update',
    { subject: 'StudListing', fields: { farmId }, farmIds: [farmId], what: 'That offer', knownToCoop: true },
    'Only members of the buck\'s own farm offer him or change his offer',
  );
}

/** Checks the buck and the chosen photos; answers the buck's owning farm. */
async function checkOffer(tx: Transaction, actor: SessionUser, input: StudOfferInput): Promise<string> {
  const ctx = await studContextFor(tx, actor, [input.buckId]);
  const buck = ctx.cardFacts.get(input.buckId);
  if (!buck) throw AppError.notFound('That buck');
  if (!buck.owningFarmId) throw AppError.validation({ buckId: [`${buck.label} is not kept on a co-op farm`] });
  ensureManages(actor, buck.owningFarmId);
  const errors: FieldMessages = {};
  if (buck.sex !== 'buck') errors.buckId = [`${buck.label} is a doe; offer a buck`];
  else if (!buck.onFarm) errors.buckId = [`${buck.label} is no longer on the farm`];
  if (input.photoIds.length > 0) {
    const found = await rows<{ id: string }>(
      tx,
      'SELECT id FROM photos WHERE id = ANY($1::uuid[]) AND animal_id = $2 AND farm_id = $3 AND deleted_at IS NULL',
      [input.photoIds, input.buckId, buck.owningFarmId],
    );
    const known = new Set(found.map((p) => p.id));
    input.photoIds.forEach((id, i) => {
      if (!known.has(id)) errors[`photoIds.${i}`] = ['Pick one of his photos taken by your farm'];
    });
  }
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);
  return buck.owningFarmId;
}

const offerValues = (input: StudOfferInput) => [
  input.loan, input.service, input.loanFeeCents, input.serviceFeeCents, input.longestLoanDays, input.restDays, input.terms, input.travelArea,
  input.lastHealthCheckOn, input.rhdv2VaccinatedOn, input.knownConditions, input.photoIds, input.shareWeights,
];

/**
 * Offers one of the farm's bucks to the co-op (publishes his buck card). Only members of his owning farm;
 * one offer per buck (an existing one is edited, or offered again after a withdrawal).
 */
export async function offerBuck(actor: SessionUser, input: StudOfferInput): Promise<BuckCardDto> {
  return withTenant(actor, async (tx) => {
    const farmId = await checkOffer(tx, actor, input);
    const [created] = await rows<{ id: string }>(
      tx,
      `INSERT INTO stud_offers (coop_id, farm_id, buck_id, offers_loan, offers_service, loan_fee_cents, service_fee_cents, longest_loan_days,
         rest_days, terms, travel_area, last_health_check_on, rhdv2_vaccinated_on, known_conditions, photo_ids, share_weights, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15::uuid[], $16, $17)
       ON CONFLICT (coop_id, buck_id) DO NOTHING RETURNING id`,
      [actor.coopId, farmId, input.buckId, ...offerValues(input), actor.id],
    );
    if (!created) throw new AppError(ErrorCode.conflict, 409, 'He is offered already: change his offer, or offer him again if it was withdrawn');
    await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: 'stud_offer.created', subjectType: 'stud_offer', subjectId: created.id, details: { buckId: input.buckId } }, tx);
    const offer = (await offerById(tx, actor.coopId, created.id))!;
    announceOffer(tx, actor.coopId, offer);
    return (await presentOffers(tx, actor, [offer]))[0]!;
  });
}

/** One buck card. */
export async function getBuckCard(actor: SessionUser, offerId: string): Promise<BuckCardDto> {
  return withTenant(actor, async (tx) => (await presentOffers(tx, actor, [await visibleOffer(tx, actor, offerId)]))[0]!);
}

/** Buck cards of the co-op (offered), or of the actor's farm (`mine`, withdrawn ones too), newest first. */
export async function listBuckCards(actor: SessionUser, q: StudOfferListQuery): Promise<BuckCardListDto> {
  return withTenant(actor, async (tx) => {
    const where = q.scope === 'mine' ? 'o.farm_id = $2' : "o.status = 'offered'";
    const bind: unknown[] = [actor.coopId];
    if (q.scope === 'mine') bind.push(actor.farmId);
    const page = await rows<OfferRow>(
      tx,
      `SELECT ${OFFER_COLUMNS}, ${OFFER_EXTRAS}, count(*) OVER () AS total_count FROM stud_offers o
       WHERE o.coop_id = $1 AND ${where} ORDER BY o.created_at DESC, o.id LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`,
      bind,
    );
    let total = page.length > 0 ? Number(page[0]!.total_count) : 0;
    if (page.length === 0 && q.page > 1) {
      const [count] = await rows<{ count: string }>(tx, `SELECT count(*) FROM stud_offers o WHERE o.coop_id = $1 AND ${where}`, bind);
      total = Number(count?.count ?? 0);
    }
    return { items: await presentOffers(tx, actor, page), total, page: q.page, pageSize: q.pageSize };
  });
}

/** Changes an offer (from the version seen; a concurrent edit answers 409). Accepted loans keep their terms. */
export async function updateOffer(actor: SessionUser, offerId: string, input: StudOfferUpdateInput): Promise<BuckCardDto> {
  return withTenant(actor, async (tx) => {
    const before = await visibleOffer(tx, actor, offerId, true);
    ensureManages(actor, before.farm_id);
    if (input.offer.buckId !== before.buck_id) throw AppError.validation({ 'offer.buckId': ['An offer stays with its buck; offer the other buck separately'] });
    if (before.version !== input.version) throw AppError.staleVersion();
    await checkOffer(tx, actor, input.offer);
    await rows(
      tx,
      `UPDATE stud_offers SET offers_loan = $3, offers_service = $4, loan_fee_cents = $5, service_fee_cents = $6, longest_loan_days = $7,
         rest_days = $8, terms = $9, travel_area = $10, last_health_check_on = $11, rhdv2_vaccinated_on = $12, known_conditions = $13,
         photo_ids = $14::uuid[], share_weights = $15, version = version + 1, updated_at = now()
       WHERE coop_id = $1 AND id = $2`,
      [actor.coopId, offerId, ...offerValues(input.offer)],
    );
    const after = (await offerById(tx, actor.coopId, offerId))!;
    const changes: Record<string, [unknown, unknown]> = {};
    for (const key of ['offers_loan', 'offers_service', 'loan_fee_cents', 'service_fee_cents', 'longest_loan_days', 'rest_days', 'terms', 'travel_area',
      'last_health_check_on', 'rhdv2_vaccinated_on', 'known_conditions', 'photo_ids', 'share_weights'] as const) {
      if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) changes[key] = [before[key], after[key]];
    }
    if (Object.keys(changes).length > 0) {
      await recordChanges({ coopId: actor.coopId, tableName: 'stud_offers', recordId: offerId, actorUserId: actor.id, changes }, tx);
    }
    announceOffer(tx, actor.coopId, after);
    return (await presentOffers(tx, actor, [after]))[0]!;
  });
}

/** Withdraws an offer (his card is hidden again; accepted loans stay) or offers him again. */
export async function setOfferPublished(actor: SessionUser, offerId: string, version: number, published: boolean): Promise<BuckCardDto> {
  return withTenant(actor, async (tx) => {
    const offer = await visibleOffer(tx, actor, offerId, true);
    ensureManages(actor, offer.farm_id);
    if (offer.version !== version) throw AppError.staleVersion();
    const status = published ? 'offered' : 'withdrawn';
    if (offer.status !== status) {
      await rows(tx, 'UPDATE stud_offers SET status = $3, version = version + 1, updated_at = now() WHERE coop_id = $1 AND id = $2', [actor.coopId, offerId, status]);
      await recordChanges({ coopId: actor.coopId, tableName: 'stud_offers', recordId: offerId, actorUserId: actor.id, changes: { status: [offer.status, status] } }, tx);
      await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: published ? 'stud_offer.offered' : 'stud_offer.withdrawn', subjectType: 'stud_offer', subjectId: offerId }, tx);
      announceOffer(tx, actor.coopId, offer);
    }
    return (await presentOffers(tx, actor, [(await offerById(tx, actor.coopId, offerId))!]))[0]!;
  });
}

interface BookingRow {
  loan_id: string | null;
  owner_farm_id: string | null;
  borrower_farm_id: string | null;
  during_start: string;
  during_end: string;
  held_end: string | null;
}

/** The days a buck is held between `from` and `to` (bookings, with the rest after loans), in one statement. */
export async function blocksOf(tx: Transaction, buckIds: string[], from: string, to: string): Promise<Map<string, (BookingRow & { buck_id: string })[]>> {
  const found = await rows<BookingRow & { buck_id: string }>(
    tx,
    `SELECT b.buck_id, b.loan_id, l.owner_farm_id, l.borrower_farm_id, lower(b.during)::text AS during_start,
       (upper(b.during) - 1)::text AS during_end, CASE WHEN isempty(b.held) THEN NULL ELSE (upper(b.held) - 1)::text END AS held_end
     FROM stud_bookings b LEFT JOIN stud_loans l ON l.id = b.loan_id
     WHERE b.buck_id = ANY($1::uuid[]) AND (b.during && daterange($2::date, $3::date, '[]')
       OR (b.loan_id IS NOT NULL AND b.held && daterange($2::date, $3::date, '[]')))
     ORDER BY lower(b.during)`,
    [buckIds, from, to],
  );
  const out = new Map<string, (BookingRow & { buck_id: string })[]>();
  for (const row of found) out.set(row.buck_id, [...(out.get(row.buck_id) ?? []), row]);
  return out;
}

/** The availability calendar of an offered buck: the days his loans, his rest after them and his own farm's services hold. */
export async function studAvailability(actor: SessionUser, offerId: string, q: StudAvailabilityQuery): Promise<StudAvailabilityDto> {
  const days = (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000;
  if (days > MAX_CALENDAR_DAYS) throw AppError.validation({ to: [`Ask for at most ${MAX_CALENDAR_DAYS} days at once`] });
  return withTenant(actor, async (tx) => {
    const offer = await visibleOffer(tx, actor, offerId);
    const bookings = (await blocksOf(tx, [offer.buck_id], q.from, q.to)).get(offer.buck_id) ?? [];
    const blocked: StudBlockDto[] = [];
    const party = (b: BookingRow) => actor.farmId !== null && (b.owner_farm_id === actor.farmId || b.borrower_farm_id === actor.farmId);
    for (const b of bookings) {
      if (!b.loan_id) {
        blocked.push({ startOn: b.during_start, endOn: b.during_end, reason: 'own_service', loanId: null });
        continue;
      }
      // Other farms see that he is taken, not whose loan it is.
      blocked.push({ startOn: b.during_start, endOn: b.during_end, reason: 'loan', loanId: party(b) || canManageOffer(actor, offer.farm_id) ? b.loan_id : null });
      if (b.held_end && b.held_end > b.during_end) {
        const restStart = new Date(Date.parse(`${b.during_end}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
        blocked.push({ startOn: restStart, endOn: b.held_end, reason: 'rest', loanId: null });
      }
    }
    return { buckId: offer.buck_id, from: q.from, to: q.to, blocked };
  });
}
