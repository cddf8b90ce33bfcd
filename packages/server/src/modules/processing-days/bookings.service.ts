import type { Transaction } from 'sequelize';
import {
  addDays, ErrorCode,
  type BookingCandidatesDto, type BookingChangeInput, type BookingCancelInput, type BookingCreateInput, type BookingDto, type BookingItem,
  type BookingListDto, type CheckInInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJobIn, handleJobs } from '../../lib/mail-outbox';
import type { SessionUser } from '../../lib/session-user';
import { animalFactsOf, animalLabel } from '../animals/animal-facts.service';
import { withdrawalsCovering, type WithdrawalFacts } from '../almanac/treatments.service';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { growingGroupsReadyBy } from '../grow-out/grow-out-facts.service';
import { postTransfer, voidPending } from '../ledger/ledger.service';
import { plannedAnimalMarksOf } from '../processing/processing.service';
import { canBookFor, canHost, ensureBookFor, ensureHost, isDayAdmin, seesMoney } from './day-access';
import { announceDay, noticeBookingChanged, noticePlaceOffered } from './day-notices';
import { presentBooking } from './processing-days.presenter';
import {
  BOOKING_COLUMNS, bookingsOfDay, capacityOf, cents, findBooking, findDay, findSite, lockDay, select, updateBooking,
  type BookingRow, type DayRow, type StoredLine,
} from './processing-days-store';

/** The queue of offered places that lapse unconfirmed (created by migration 0074). */
export const OFFER_QUEUE = 'processing-day-offers';

/** How long a promoted member has to confirm an offered place (common practice for a shared day: a day). */
export const OFFER_CONFIRM_HOURS = 24;

interface OfferJob {
  coopId: string;
  dayId: string;
  bookingId: string;
}

/** A booking's pending fee: one transfer per revision of its head, so a changed booking voids the old and posts the new once. */
export const feeTransferId = (bookingId: string, revision: number) => `processing-booking:${bookingId}:fee:${revision}`;

function withdrawalRefusal(label: string, date: string, w: WithdrawalFacts): string {
  const eligibleOn = addDays(w.withdrawalEndsOn, 1);
  return `${label} is under a medicine withdrawal (${w.treatment}) on ${date}: it may be processed from ${eligibleOn}`;
}

/**
 * The lines of a booking checked against the farm: growing groups with heads left (less what its other
 * bookings of the day hold), animals it owns and keeps, and nothing under a withdrawal on the day.
 */
async function resolveLines(tx: Transaction, coopId: string, day: DayRow, farmId: string, items: BookingItem[], exceptBookingId?: string): Promise<StoredLine[]> {
  const directory = await farmDirectoryOf(coopId, tx);
  const today = farmTodayIn(directory, farmId);
  const errors: Record<string, string[]> = {};
  const groupItems = items.flatMap((item, index) => ('groupId' in item ? [{ ...item, index }] : []));
  const animalItems = items.flatMap((item, index) => ('animalId' in item ? [{ ...item, index }] : []));
  const groups = groupItems.length > 0 ? await growingGroupsReadyBy(tx, coopId, farmId, day.date, today) : [];
  const others = await select<{ lines: StoredLine[] }>(
    tx, 'SELECT lines FROM processing_bookings WHERE day_id = $1 AND farm_id = $2 AND status <> \'cancelled\' AND id <> $3::uuid', [day.id, farmId, exceptBookingId ?? '00000000-0000-0000-0000-000000000000'],
  );
  const heldHeads = new Map<string, number>();
  for (const line of others.flatMap((o) => o.lines)) {
    const key = line.groupId ?? line.animalId!;
    heldHeads.set(key, (heldHeads.get(key) ?? 0) + line.head);
  }
  const animals = await animalFactsOf(tx, coopId, animalItems.map((a) => a.animalId));
  const withdrawals = await withdrawalsCovering(tx, coopId, { animalIds: animalItems.map((a) => a.animalId), groupIds: groupItems.map((g) => g.groupId) }, day.date);
  const lines: StoredLine[] = [];
  for (const item of groupItems) {
    const path = `items.${item.index}.groupId`;
    const group = groups.find((g) => g.id === item.groupId);
    if (!group) {
      (errors[path] ??= []).push('Choose a growing group of your farm');
      continue;
    }
    const left = group.headsLeft - (heldHeads.get(group.id) ?? 0);
    if (item.head > left) (errors[`items.${item.index}.head`] ??= []).push(`${group.name} has ${left} head left to book`);
    const w = withdrawals.groups.get(group.id);
    if (w) (errors[path] ??= []).push(withdrawalRefusal(group.name, day.date, w));
    lines.push({ groupId: group.id, animalId: null, label: group.name, head: item.head });
  }
  for (const item of animalItems) {
    const path = `items.${item.index}.animalId`;
    const animal = animals.get(item.animalId);
    if (!animal || animal.isOutside || animal.owningFarmId !== farmId || animal.keepingFarmId !== farmId) {
      (errors[path] ??= []).push('Choose an animal your farm owns and keeps');
      continue;
    }
    const label = animalLabel(animal);
    if (animal.disposition !== 'on_farm') (errors[path] ??= []).push(`${label} is no longer on the farm`);
    if (heldHeads.has(animal.id)) (errors[path] ??= []).push(`${label} is already booked on this day`);
    const w = withdrawals.animals.get(animal.id);
    if (w) (errors[path] ??= []).push(withdrawalRefusal(label, day.date, w));
    lines.push({ groupId: null, animalId: animal.id, label, head: 1 });
  }
  if (Object.keys(errors).length > 0) throw AppError.validation(errors, 'Some of the animals cannot be booked');
  return lines;
}

async function postFee(tx: Transaction, day: DayRow, row: BookingRow, actorId: string | null): Promise<void> {
  const amountCents = cents(day.fee_per_head_cents) * row.head;
  if (amountCents <= 0) return;
  await postTransfer(tx, {
    id: feeTransferId(row.id, row.fee_revision), kind: 'processing_fee', debit: { farmId: row.farm_id }, credit: { coop: 'coop_processing' },
    amountCents, pending: true, sourceType: 'processing_booking', sourceId: row.id, memo: `Processing ${row.head} head on ${day.date}`, postedBy: actorId,
  });
}

async function voidFee(tx: Transaction, day: DayRow, row: BookingRow): Promise<void> {
  if (row.status !== 'booked' || cents(day.fee_per_head_cents) * row.head <= 0) return;
  await voidPending(tx, feeTransferId(row.id, row.fee_revision));
}

function deadlinePassed(directory: Awaited<ReturnType<typeof farmDirectoryOf>>, day: DayRow): boolean {
  return farmTodayIn(directory, day.host_farm_id) > day.sign_up_deadline;
}

/** Until the deadline the farm's members change and cancel; after it only the admin. */
async function ensureOpenFor(tx: Transaction, actor: SessionUser, day: DayRow): Promise<void> {
  if (day.status !== 'scheduled') throw AppError.conflict(`The day is ${day.status}; bookings can no longer change`);
  if (!isDayAdmin(actor) && deadlinePassed(await farmDirectoryOf(actor.coopId, tx), day)) {
    throw new AppError(ErrorCode.forbidden, 403, `Bookings closed on ${day.sign_up_deadline}; ask the co-op's admin`);
  }
}

async function presentBookings(tx: Transaction, actor: SessionUser, day: DayRow, rows: BookingRow[], all?: BookingRow[]): Promise<BookingDto[]> {
  const directory = await farmDirectoryOf(actor.coopId, tx);
  const queue = (all ?? (await bookingsOfDay(tx, day.id))).filter((b) => b.status === 'waitlisted').map((b) => b.id);
  const hostToday = farmTodayIn(directory, day.host_farm_id);
  const open = day.status === 'scheduled' && (isDayAdmin(actor) || hostToday <= day.sign_up_deadline);
  const runsDay = isDayAdmin(actor) || canHost(actor, day);
  return rows.map((row) => {
    const mine = canBookFor(actor, row.farm_id);
    const live = row.status !== 'cancelled';
    // Which groups and animals a farm brings is its own business; the host and admin see the labels to run the day.
    const ownFarm = actor.farmId === row.farm_id;
    const shown = ownFarm ? row : { ...row, lines: runsDay ? row.lines.map((l) => ({ ...l, groupId: null, animalId: null })) : [] };
    return presentBooking(shown, {
      farmName: directory.get(row.farm_id)?.name ?? 'A former member farm',
      waitlistPosition: row.status === 'waitlisted' ? queue.indexOf(row.id) + 1 : null,
      feePerHeadCents: seesMoney(actor, row.farm_id) ? cents(day.fee_per_head_cents) : null,
      can: {
        canChange: live && mine && open, canCancel: live && mine && open,
        canConfirm: row.status === 'offered' && mine,
        canCheckIn: row.status === 'booked' && day.status === 'scheduled' && canHost(actor, day) && hostToday >= day.date,
      },
    });
  });
}

/**
 * Promotes the waitlist in its order while the first waiting booking fits the free places: each promoted
 * farm is offered the places, told at once and given OFFER_CONFIRM_HOURS to confirm; a lapsed offer passes
 * on. The day's row must be locked by the caller. Answers the capacity after.
 */
export async function promoteWaitlist(tx: Transaction, coopId: string, day: DayRow, siteName: string, now: Date = new Date()) {
  const active = (await bookingsOfDay(tx, day.id)).filter((b) => b.status !== 'cancelled');
  let free = capacityOf(day, active).freeHead;
  for (const waiting of active.filter((b) => b.status === 'waitlisted')) {
    // A definite order: nobody jumps the queue, even with a smaller booking.
    if (waiting.head > free) break;
    const expiresAt = new Date(now.getTime() + OFFER_CONFIRM_HOURS * 3_600_000);
    const offered = await updateBooking(tx, waiting.id, { status: 'offered', offer_expires_at: expiresAt });
    Object.assign(waiting, offered);
    free -= waiting.head;
    await enqueueJobIn(tx, OFFER_QUEUE, { coopId, dayId: day.id, bookingId: waiting.id } satisfies OfferJob, { startAfter: expiresAt });
    await noticePlaceOffered(tx, { coopId, farmId: waiting.farm_id, bookingId: waiting.id, day, siteName, head: waiting.head, expiresAt, round: offered.version });
  }
  return capacityOf(day, active);
}

async function bookingByKey(tx: Transaction, key: string): Promise<BookingRow | undefined> {
  const [row] = await select<BookingRow>(tx, `SELECT ${BOOKING_COLUMNS} FROM processing_bookings b WHERE b.idempotency_key = $1`, [key]);
  return row;
}

/**
 * A farm books head on a day. With the day's row locked: booked when the places are free and nobody waits,
 * else waitlisted behind those already waiting. A booked place's fee becomes a pending Ledger transfer. The
 * same idempotency key again answers the first booking.
 */
export async function bookPlaces(actor: SessionUser, dayId: string, input: BookingCreateInput): Promise<{ booking: BookingDto; created: boolean }> {
  ensureBookFor(actor, input.farmId);
  return withTenant(actor, (tx) => bookPlacesIn(tx, actor, dayId, input));
}

/** bookPlaces inside the caller's transaction (the demo loader). */
export async function bookPlacesIn(tx: Transaction, actor: SessionUser, dayId: string, input: BookingCreateInput): Promise<{ booking: BookingDto; created: boolean }> {
  ensureBookFor(actor, input.farmId);
  const earlier = await bookingByKey(tx, input.idempotencyKey);
  if (earlier) {
    if (earlier.day_id !== dayId || earlier.farm_id !== input.farmId) throw AppError.idTaken();
    return { booking: (await presentBookings(tx, actor, await findDay(tx, dayId), [earlier]))[0]!, created: false };
  }
  const day = await lockDay(tx, dayId);
  await ensureOpenFor(tx, actor, day);
  const lines = await resolveLines(tx, actor.coopId, day, input.farmId, input.items);
  const head = lines.reduce((n, l) => n + l.head, 0);
  const active = (await bookingsOfDay(tx, dayId)).filter((b) => b.status !== 'cancelled');
  const capacity = capacityOf(day, active);
  const status = !active.some((b) => b.status === 'waitlisted') && head <= capacity.freeHead ? 'booked' : 'waitlisted';
  const [row] = await select<BookingRow>(
    tx,
    `INSERT INTO processing_bookings AS b (coop_id, day_id, farm_id, idempotency_key, status, head, lines, booked_by)
     VALUES (current_coop_id(), $1, $2, $3, $4, $5, $6::jsonb, $7) RETURNING ${BOOKING_COLUMNS}`,
    [dayId, input.farmId, input.idempotencyKey, status, head, JSON.stringify(lines), actor.id],
  );
  if (status === 'booked') await postFee(tx, day, row!, actor.id);
  const all = [...active, row!];
  await noticeBookingChanged(tx, {
    coopId: actor.coopId, farmId: input.farmId, actorId: actor.id, bookingId: row!.id, version: row!.version, day,
    title: `${actor.name} ${status === 'booked' ? 'booked' : 'joined the waitlist with'} ${head} head for ${day.date}`,
    text: `${actor.name} ${status === 'booked' ? 'booked' : 'put on the waitlist'} ${head} head for the processing day of ${day.date}.`,
  });
  announceDay(tx, actor.coopId, { dayId, what: 'capacity', capacity: capacityOf(day, all) });
  return { booking: (await presentBookings(tx, actor, day, [row!], all))[0]!, created: true };
}

/** Changes what a booking brings. A booked farm may grow only into free places; fewer head free places for the waitlist. */
export async function changeBooking(actor: SessionUser, dayId: string, bookingId: string, input: BookingChangeInput): Promise<BookingDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const row = await findBooking(tx, dayId, bookingId);
    ensureBookFor(actor, row.farm_id);
    if (row.version !== input.version) throw AppError.staleVersion();
    if (row.status === 'cancelled') throw AppError.conflict('The booking is cancelled; book again');
    await ensureOpenFor(tx, actor, day);
    const lines = await resolveLines(tx, actor.coopId, day, row.farm_id, input.items, row.id);
    const head = lines.reduce((n, l) => n + l.head, 0);
    const active = (await bookingsOfDay(tx, dayId)).filter((b) => b.status !== 'cancelled' && b.id !== row.id);
    const holds = row.status === 'booked' || row.status === 'offered';
    if (holds && head > row.head) {
      const free = capacityOf(day, active).freeHead;
      if (head > free) throw AppError.conflict(`Only ${free} places are free for this booking; book the rest separately to join the waitlist`);
    }
    const feeChanges = row.status === 'booked' && head !== row.head;
    if (feeChanges) await voidFee(tx, day, row);
    const updated = await updateBooking(tx, row.id, { head, lines, fee_revision: feeChanges ? row.fee_revision + 1 : row.fee_revision });
    if (feeChanges) await postFee(tx, day, updated, actor.id);
    const site = await findSite(tx, day.site_id);
    const capacity = holds && head < row.head ? await promoteWaitlist(tx, actor.coopId, day, site.name) : capacityOf(day, [...active, updated]);
    await noticeBookingChanged(tx, {
      coopId: actor.coopId, farmId: row.farm_id, actorId: actor.id, bookingId: row.id, version: updated.version, day,
      title: `${actor.name} changed the booking for ${day.date} to ${head} head`, text: `The booking for the processing day of ${day.date} is now ${head} head.`,
    });
    announceDay(tx, actor.coopId, { dayId, what: 'capacity', capacity });
    return (await presentBookings(tx, actor, day, [updated]))[0]!;
  });
}

/** Cancels a booking: its pending fee is voided and its places go to the waitlist in order. */
export async function cancelBooking(actor: SessionUser, dayId: string, bookingId: string, input: BookingCancelInput): Promise<BookingDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const row = await findBooking(tx, dayId, bookingId);
    ensureBookFor(actor, row.farm_id);
    if (row.version !== input.version) throw AppError.staleVersion();
    if (row.status === 'cancelled') throw AppError.conflict('The booking is already cancelled');
    await ensureOpenFor(tx, actor, day);
    await voidFee(tx, day, row);
    const updated = await updateBooking(tx, row.id, { status: 'cancelled', offer_expires_at: null, cancelled_reason: input.reason || 'Cancelled' });
    const site = await findSite(tx, day.site_id);
    const capacity = await promoteWaitlist(tx, actor.coopId, day, site.name);
    await noticeBookingChanged(tx, {
      coopId: actor.coopId, farmId: row.farm_id, actorId: actor.id, bookingId: row.id, version: updated.version, day,
      title: `${actor.name} cancelled the booking of ${row.head} head for ${day.date}`, text: `${actor.name} cancelled the booking of ${row.head} head for the processing day of ${day.date}.`,
    });
    announceDay(tx, actor.coopId, { dayId, what: 'capacity', capacity });
    return (await presentBookings(tx, actor, day, [updated]))[0]!;
  });
}

/** The promoted farm takes its offered places before the offer lapses: booked, and its fee pending. */
export async function confirmOffer(actor: SessionUser, dayId: string, bookingId: string, version: number, now: Date = new Date()): Promise<BookingDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const row = await findBooking(tx, dayId, bookingId);
    ensureBookFor(actor, row.farm_id);
    if (row.version !== version) throw AppError.staleVersion();
    if (row.status !== 'offered') throw AppError.conflict(`The booking is ${row.status}; there is no offer to confirm`);
    if (row.offer_expires_at && new Date(row.offer_expires_at) <= now) throw AppError.conflict('The offer lapsed; the places pass to the next farm');
    const updated = await updateBooking(tx, row.id, { status: 'booked', offer_expires_at: null });
    await postFee(tx, day, updated, actor.id);
    announceDay(tx, actor.coopId, { dayId, what: 'capacity', capacity: capacityOf(day, (await bookingsOfDay(tx, dayId)).filter((b) => b.status !== 'cancelled')) });
    return (await presentBookings(tx, actor, day, [updated]))[0]!;
  });
}

/** The job when an offer's time is up: still unconfirmed, it is cancelled and the next farm is offered the places. Safe to run twice. */
export async function lapseOffer(job: OfferJob, now: Date = new Date()): Promise<boolean> {
  return withTenant({ coopId: job.coopId }, async (tx) => {
    const day = await lockDay(tx, job.dayId);
    const row = await findBooking(tx, job.dayId, job.bookingId);
    if (row.status !== 'offered' || !row.offer_expires_at || new Date(row.offer_expires_at) > now) return false;
    const updated = await updateBooking(tx, row.id, { status: 'cancelled', offer_expires_at: null, cancelled_reason: 'The offered places were not confirmed in time' });
    await noticeBookingChanged(tx, {
      coopId: job.coopId, farmId: row.farm_id, actorId: null, bookingId: row.id, version: updated.version, day,
      title: `The places offered for ${day.date} passed on`, text: `The places offered on the processing day of ${day.date} were not confirmed in time and passed to the next farm.`,
    });
    const site = await findSite(tx, day.site_id);
    const capacity = await promoteWaitlist(tx, job.coopId, day, site.name, now);
    announceDay(tx, job.coopId, { dayId: day.id, what: 'capacity', capacity });
    return true;
  });
}

handleJobs<OfferJob>(OFFER_QUEUE, async (job) => {
  await lapseOffer(job);
});

/** The host (or admin) checks a farm's batch in on the day: the head actually brought. */
export async function checkIn(actor: SessionUser, dayId: string, bookingId: string, input: CheckInInput): Promise<BookingDto> {
  return withTenant(actor, (tx) => checkInIn(tx, actor, dayId, bookingId, input));
}

/** checkIn inside the caller's transaction (the demo loader). */
export async function checkInIn(tx: Transaction, actor: SessionUser, dayId: string, bookingId: string, input: CheckInInput): Promise<BookingDto> {
  const day = await lockDay(tx, dayId);
  ensureHost(actor, day, 'Only the host or the admin checks batches in');
  const row = await findBooking(tx, dayId, bookingId);
  if (row.version !== input.version) throw AppError.staleVersion();
  if (row.status !== 'booked') throw AppError.conflict(`The booking is ${row.status}; only booked places are checked in`);
  if (day.status !== 'scheduled') throw AppError.conflict(`The day is ${day.status}`);
  const hostToday = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), day.host_farm_id);
  if (hostToday < day.date) throw AppError.conflict(`Check-in opens on the day (${day.date})`);
  if (input.headBrought > row.head) throw AppError.validation({ headBrought: [`${row.head} head are booked; more cannot be processed on this booking`] });
  const updated = await updateBooking(tx, row.id, { head_brought: input.headBrought, checked_in_at: new Date() });
  announceDay(tx, actor.coopId, { dayId, what: 'changed', capacity: capacityOf(day, (await bookingsOfDay(tx, dayId)).filter((b) => b.status !== 'cancelled')) });
  return (await presentBookings(tx, actor, day, [updated]))[0]!;
}

/** Every booking of the day in the waitlist's order, cancelled ones last. */
export async function listBookings(actor: SessionUser, dayId: string): Promise<BookingListDto> {
  return withTenant(actor, (tx) => listBookingsIn(tx, actor, dayId));
}

export async function listBookingsIn(tx: Transaction, actor: SessionUser, dayId: string): Promise<BookingListDto> {
  const day = await findDay(tx, dayId);
  const all = await bookingsOfDay(tx, dayId);
  const ordered = [...all.filter((b) => b.status !== 'cancelled'), ...all.filter((b) => b.status === 'cancelled')];
  return { items: await presentBookings(tx, actor, day, ordered, all), total: all.length };
}

/** What a farm may bring: its growing groups reaching target by the day first (the projection), then its planned culls; withdrawals shown with the day they end. */
export async function bookingCandidates(actor: SessionUser, dayId: string, farmId: string): Promise<BookingCandidatesDto> {
  ensureBookFor(actor, farmId);
  return withTenant(actor, async (tx) => {
    const day = await findDay(tx, dayId);
    const today = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), farmId);
    const groups = await growingGroupsReadyBy(tx, actor.coopId, farmId, day.date, today);
    const culls = await plannedAnimalMarksOf(tx, actor.coopId, farmId);
    const animals = await animalFactsOf(tx, actor.coopId, culls.map((c) => c.animalId));
    const withdrawals = await withdrawalsCovering(tx, actor.coopId, { groupIds: groups.map((g) => g.id), animalIds: culls.map((c) => c.animalId) }, day.date);
    const held = await select<{ lines: StoredLine[] }>(tx, 'SELECT lines FROM processing_bookings WHERE day_id = $1 AND farm_id = $2 AND status <> \'cancelled\'', [dayId, farmId]);
    const heldHeads = new Map<string, number>();
    for (const line of held.flatMap((h) => h.lines)) heldHeads.set(line.groupId ?? line.animalId!, (heldHeads.get(line.groupId ?? line.animalId!) ?? 0) + line.head);
    const eligibleOn = (w: WithdrawalFacts | undefined) => (w ? addDays(w.withdrawalEndsOn, 1) : null);
    return {
      dayId, date: day.date,
      items: [
        ...groups.map((g) => {
          const w = withdrawals.groups.get(g.id);
          return {
            groupId: g.id, animalId: null, label: g.name, headAvailable: Math.max(0, g.headsLeft - (heldHeads.get(g.id) ?? 0)), projectedReadyOn: g.projectedOn,
            readyByDay: ['reached', 'ready', 'likely'].includes(g.readiness), eligibleOn: eligibleOn(w), eligible: !w,
          };
        }),
        ...culls.filter((c) => animals.get(c.animalId)?.disposition === 'on_farm').map((c) => {
          const w = withdrawals.animals.get(c.animalId);
          return {
            groupId: null, animalId: c.animalId, label: animalLabel(animals.get(c.animalId)), headAvailable: heldHeads.has(c.animalId) ? 0 : 1,
            projectedReadyOn: null, readyByDay: true, eligibleOn: eligibleOn(w), eligible: !w,
          };
        }),
      ],
    };
  });
}
