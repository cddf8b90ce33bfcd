import type { Transaction } from 'sequelize';
import {
  ErrorCode, largestRemainder,
  type CostLine, type DayCloseInput, type DayOutcomeDto, type DaySummaryBreedDto, type DaySummaryFarmDto, type DayYieldCreateInput,
  type ProcessingDaySummaryDto, type ProcessingRecordDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';
import { animalFactsOf } from '../animals/animal-facts.service';
import { ensureCan } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { crossLabelsOfGroups } from '../grow-out/grow-out-facts.service';
import { postPending, postTransfer, voidPending } from '../ledger/ledger.service';
import { processingFactsByIds, recordProcessingIn, type ProcessingFacts } from '../processing/processing.service';
import { getCoop } from '../coops/coops.service';
import { feeTransferId, listBookingsIn } from './bookings.service';
import { daySheetPdf } from './day-sheet';
import { dayDetailIn } from './processing-days.service';
import { ensureHost, seesMoney } from './day-access';
import { announceDay, noticeDayChanged } from './day-notices';
import { bookingsOfDay, capacityOf, cents, findBooking, findDay, findSite, lockDay, select, updateBooking, type BookingRow, type DayRow } from './processing-days-store';

/** The fee of head processed beyond or below what was booked: posted under its own id, once. */
export const finalFeeTransferId = (bookingId: string) => `processing-booking:${bookingId}:fee:final`;
export const sharedCostTransferId = (dayId: string, farmId: string) => `processing-day:${dayId}:shared-cost:${farmId}`;

interface YieldRow {
  record_id: string;
  booking_id: string;
  farm_id: string;
  trimmed_head: number;
  condemned_head: number;
  outcome_reason: string;
}

async function yieldsOfDay(tx: Transaction, coopId: string, dayId: string): Promise<{ links: YieldRow[]; records: Map<string, ProcessingFacts> }> {
  const links = await select<YieldRow>(tx, 'SELECT record_id, booking_id, farm_id, trimmed_head, condemned_head, outcome_reason FROM processing_day_yields WHERE day_id = $1 ORDER BY created_at, record_id', [dayId]);
  const records = new Map((await processingFactsByIds(tx, coopId, links.map((l) => l.record_id))).map((r) => [r.id, r]));
  return { links, records };
}

/** Head processed per booking: the yields recorded for it, else the head checked in. */
function processedByBooking(bookings: BookingRow[], links: YieldRow[], records: Map<string, ProcessingFacts>): Map<string, number> {
  const result = new Map<string, number>();
  for (const b of bookings.filter((x) => x.status === 'booked')) {
    const own = links.filter((l) => l.booking_id === b.id);
    result.set(b.id, own.length > 0 ? own.reduce((n, l) => n + (records.get(l.record_id)?.headCount ?? 0), 0) : (b.head_brought ?? 0));
  }
  return result;
}

/** Splits the shared costs to the farms by head processed, in whole cents, by the largest remainder (the parts add up to the total). */
export function splitSharedCosts(totalCents: number, headByFarm: ReadonlyArray<{ farmId: string; head: number }>): Map<string, number> {
  if (headByFarm.length === 0 || totalCents === 0) return new Map(headByFarm.map((f) => [f.farmId, 0]));
  const parts = largestRemainder(totalCents, headByFarm.map((f) => f.head));
  return new Map(headByFarm.map((f, i) => [f.farmId, parts[i]!]));
}

const costTotal = (lines: CostLine[]) => lines.reduce((n, l) => n + l.amountCents, 0);

function headByFarm(bookings: BookingRow[], processed: Map<string, number>): { farmId: string; head: number }[] {
  const byFarm = new Map<string, number>();
  for (const b of bookings) if (processed.has(b.id)) byFarm.set(b.farm_id, (byFarm.get(b.farm_id) ?? 0) + processed.get(b.id)!);
  return [...byFarm.entries()].map(([farmId, head]) => ({ farmId, head })).sort((a, b) => a.farmId.localeCompare(b.farmId));
}

/**
 * Yields of a checked-in batch, recorded by the booking farm's member as the farm's own processing record
 * (with its withdrawal, head-left and weight checks), linked to the day with any trimmed or condemned carcasses.
 */
export async function recordDayYield(actor: SessionUser, dayId: string, input: DayYieldCreateInput): Promise<ProcessingRecordDto> {
  return withTenant(actor, (tx) => recordDayYieldIn(tx, actor, dayId, input));
}

/** recordDayYield inside the caller's transaction (the demo loader). */
export async function recordDayYieldIn(tx: Transaction, actor: SessionUser, dayId: string, input: DayYieldCreateInput): Promise<ProcessingRecordDto> {
  const day = await lockDay(tx, dayId);
  const booking = await findBooking(tx, dayId, input.bookingId);
  // Bookings are known to the whole co-op: another farm is refused (403), not told it does not exist.
  if (actor.farmId !== booking.farm_id) throw new AppError(ErrorCode.forbidden, 403, 'Yields are the farm\'s own processing records: its members record them');
  ensureCan(actor, 'create', 'ProcessingRecord', { farmId: booking.farm_id }, 'That booking', 'Yields are the farm\'s own processing records: its members record them');
  if (day.status !== 'scheduled') throw AppError.conflict(`The day is ${day.status}; its yields are final`);
  if (booking.status !== 'booked' || booking.head_brought === null) throw AppError.conflict('Check the batch in before recording its yields');
  const line = booking.lines.find((l) => (input.groupId ? l.groupId === input.groupId : l.animalId === input.animalId));
  if (!line) throw AppError.validation({ [input.groupId ? 'groupId' : 'animalId']: ['Choose a group or animal of this booking'] });
  if (input.id) {
    const [existing] = await select<{ record_id: string }>(tx, 'SELECT record_id FROM processing_day_yields WHERE record_id = $1', [input.id]);
    if (existing) {
      return recordProcessingIn(tx, actor, { id: input.id, animalId: input.animalId, groupId: input.groupId, processedOn: day.date, headCount: input.headCount, liveGrams: input.liveGrams, hotCarcassGrams: input.hotCarcassGrams, chilledCarcassGrams: input.chilledCarcassGrams, notes: input.notes, confirm: true });
    }
  }
  const { links, records } = await yieldsOfDay(tx, actor.coopId, dayId);
  const recorded = links.filter((l) => l.booking_id === booking.id).reduce((n, l) => n + (records.get(l.record_id)?.headCount ?? 0), 0);
  if (recorded + input.headCount > booking.head_brought) {
    throw AppError.validation({ headCount: [`${booking.head_brought} head were checked in and ${recorded} are recorded; ${input.headCount} more is too many`] });
  }
  // The day's yields are read off the station's scale in front of the crew: the farm's last weigh-in does not question them.
  const record = await recordProcessingIn(tx, actor, {
    id: input.id, animalId: input.animalId, groupId: input.groupId, processedOn: day.date, headCount: input.headCount,
    liveGrams: input.liveGrams, hotCarcassGrams: input.hotCarcassGrams, chilledCarcassGrams: input.chilledCarcassGrams, notes: input.notes, confirm: true,
  });
  await select(
    tx,
    `INSERT INTO processing_day_yields (record_id, coop_id, day_id, booking_id, farm_id, trimmed_head, condemned_head, outcome_reason)
     VALUES ($1, current_coop_id(), $2, $3, $4, $5, $6, $7) ON CONFLICT (record_id) DO NOTHING`,
    [record.id, dayId, booking.id, booking.farm_id, input.trimmedHead, input.condemnedHead, input.outcomeReason],
  );
  announceDay(tx, actor.coopId, { dayId, what: 'changed', capacity: capacityOf(day, (await bookingsOfDay(tx, dayId)).filter((b) => b.status !== 'cancelled')) });
  return record;
}

/**
 * After the day the host or admin closes it, once: each booking's fee is posted for the head actually
 * processed (the pending transfer as it is, or voided and posted anew for another count), places still
 * waiting are cancelled, and the shared costs are split to the farms by head processed.
 */
export async function closeDay(actor: SessionUser, dayId: string, input: DayCloseInput): Promise<ProcessingDaySummaryDto> {
  return withTenant(actor, (tx) => closeDayIn(tx, actor, dayId, input));
}

/** closeDay inside the caller's transaction (the demo loader). */
export async function closeDayIn(tx: Transaction, actor: SessionUser, dayId: string, input: DayCloseInput): Promise<ProcessingDaySummaryDto> {
  const day = await lockDay(tx, dayId);
  ensureHost(actor, day, 'Only the host or the admin closes the day');
  if (day.version !== input.version) throw AppError.staleVersion();
  if (day.status !== 'scheduled') throw AppError.conflict(`The day is already ${day.status}`);
  const hostToday = farmTodayIn(await farmDirectoryOf(actor.coopId, tx), day.host_farm_id);
  if (hostToday < day.date) throw AppError.conflict(`The day is ${day.date}; close it once it has happened`);
  const bookings = await bookingsOfDay(tx, dayId);
  const { links, records } = await yieldsOfDay(tx, actor.coopId, dayId);
  const processed = processedByBooking(bookings, links, records);
  const fee = cents(day.fee_per_head_cents);
  for (const b of bookings) {
    if (b.status === 'waitlisted' || b.status === 'offered') {
      await updateBooking(tx, b.id, { status: 'cancelled', offer_expires_at: null, cancelled_reason: 'The day took place without these places' });
      continue;
    }
    if (b.status !== 'booked' || fee === 0) continue;
    const head = processed.get(b.id) ?? 0;
    if (head === b.head) {
      await postPending(tx, feeTransferId(b.id, b.fee_revision), actor.id);
    } else {
      await voidPending(tx, feeTransferId(b.id, b.fee_revision));
      if (head > 0) {
        await postTransfer(tx, {
          id: finalFeeTransferId(b.id), kind: 'processing_fee', debit: { farmId: b.farm_id }, credit: { coop: 'coop_processing' }, amountCents: head * fee,
          sourceType: 'processing_booking', sourceId: b.id, memo: `Processing ${head} head on ${day.date}`, postedBy: actor.id,
        });
      }
    }
  }
  const costs = input.actualCosts ?? day.expected_costs;
  const total = costTotal(costs);
  const shares = headByFarm(bookings, processed);
  const totalHead = shares.reduce((n, s) => n + s.head, 0);
  if (total > 0 && totalHead === 0) throw AppError.conflict('No head were processed: there is nothing to split the shared costs by');
  for (const [farmId, amountCents] of splitSharedCosts(total, shares)) {
    if (amountCents === 0) continue;
    const head = shares.find((s) => s.farmId === farmId)!.head;
    await postTransfer(tx, {
      id: sharedCostTransferId(dayId, farmId), kind: 'shared_cost', debit: { farmId }, credit: { coop: 'coop_processing' }, amountCents,
      sourceType: 'processing_day', sourceId: dayId, memo: `Shared costs of the processing day of ${day.date}: ${head} of ${totalHead} head`, postedBy: actor.id,
    });
  }
  const [closed] = await select<DayRow>(
    tx,
    `UPDATE processing_days SET status = 'closed', actual_costs = $2::jsonb, closed_at = now(), version = version + 1, updated_at = now() WHERE id = $1
     RETURNING id, to_char(date, 'YYYY-MM-DD') AS date, start_time, version`,
    [dayId, JSON.stringify(costs)],
  );
  const site = await findSite(tx, day.site_id);
  await noticeDayChanged(tx, {
    coopId: actor.coopId, farmIds: shares.map((s) => s.farmId), actorId: actor.id, day: { ...day, ...closed! }, siteName: site.name,
    what: 'closed: the fees and shared costs are posted to the Ledger',
  });
  announceDay(tx, actor.coopId, { dayId, what: 'closed', capacity: capacityOf(day, []) });
  return summaryIn(tx, actor, dayId);
}

export async function daySummary(actor: SessionUser, dayId: string): Promise<ProcessingDaySummaryDto> {
  return withTenant(actor, (tx) => summaryIn(tx, actor, dayId));
}

/** The day's results: head, weights and dress-out per farm and per breed or cross, trimmed and condemned carcasses; money only to who sees it. */
export async function summaryIn(tx: Transaction, actor: SessionUser, dayId: string): Promise<ProcessingDaySummaryDto> {
  const day = await findDay(tx, dayId);
  const bookings = await bookingsOfDay(tx, dayId);
  const { links, records } = await yieldsOfDay(tx, actor.coopId, dayId);
  const directory = await farmDirectoryOf(actor.coopId, tx);
  const farmName = (id: string) => directory.get(id)?.name ?? 'A former member farm';
  const processed = processedByBooking(bookings, links, records);
  const fee = cents(day.fee_per_head_cents);
  const shares = headByFarm(bookings, processed);
  const split = splitSharedCosts(costTotal(day.actual_costs ?? day.expected_costs), shares.some((s) => s.head > 0) ? shares : []);
  const farms = new Map<string, DaySummaryFarmDto>();
  for (const b of bookings.filter((x) => x.status === 'booked')) {
    const f = farms.get(b.farm_id) ?? {
      farmId: b.farm_id, farmName: farmName(b.farm_id), headBooked: 0, headBrought: 0, headProcessed: 0, liveGrams: 0, hotCarcassGrams: 0,
      dressOut: null, trimmedHead: 0, condemnedHead: 0,
    };
    f.headBooked += b.head;
    f.headBrought += b.head_brought ?? 0;
    f.headProcessed += processed.get(b.id) ?? 0;
    farms.set(b.farm_id, f);
  }
  const groupLabels = await crossLabelsOfGroups(tx, actor.coopId, [...new Set([...records.values()].map((r) => r.groupId).filter((id): id is string => Boolean(id)))]);
  const animals = await animalFactsOf(tx, actor.coopId, [...records.values()].map((r) => r.animalId).filter((id): id is string => Boolean(id)));
  const breeds = new Map<string, { head: number; live: number; hot: number }>();
  const outcomes: DayOutcomeDto[] = [];
  for (const link of links) {
    const r = records.get(link.record_id);
    if (!r) continue;
    const f = farms.get(link.farm_id);
    if (f) {
      f.liveGrams += r.liveGrams;
      f.hotCarcassGrams += r.hotCarcassGrams;
      f.trimmedHead += link.trimmed_head;
      f.condemnedHead += link.condemned_head;
    }
    const label = r.groupId ? groupLabels.get(r.groupId)?.crossLabel ?? 'Cross unknown' : (animals.get(r.animalId!)?.lineBreedName ?? animals.get(r.animalId!)?.breedName ?? 'Breed unknown');
    const b = breeds.get(label) ?? { head: 0, live: 0, hot: 0 };
    breeds.set(label, { head: b.head + r.headCount, live: b.live + r.liveGrams, hot: b.hot + r.hotCarcassGrams });
    if (link.trimmed_head > 0) outcomes.push({ farmId: link.farm_id, farmName: farmName(link.farm_id), outcome: 'trimmed', head: link.trimmed_head, reason: link.outcome_reason });
    if (link.condemned_head > 0) outcomes.push({ farmId: link.farm_id, farmName: farmName(link.farm_id), outcome: 'condemned', head: link.condemned_head, reason: link.outcome_reason });
  }
  const ratio = (hot: number, live: number) => (live > 0 ? Math.round((hot / live) * 1000) / 1000 : null);
  const byBreed: DaySummaryBreedDto[] = [...breeds.entries()].map(([label, b]) => ({ label, headProcessed: b.head, dressOut: ratio(b.hot, b.live) })).sort((a, b) => a.label.localeCompare(b.label));
  const money = seesMoney(actor);
  return {
    dayId, date: day.date, status: day.status,
    headProcessed: [...farms.values()].reduce((n, f) => n + f.headProcessed, 0),
    farms: [...farms.values()].map((f) => ({
      ...f, dressOut: ratio(f.hotCarcassGrams, f.liveGrams),
      ...(seesMoney(actor, f.farmId) ? { feeCents: f.headProcessed * fee, sharedCostCents: split.get(f.farmId) ?? 0 } : {}),
    })).sort((a, b) => a.farmName.localeCompare(b.farmName)),
    byBreed, outcomes,
    ...(money ? { totalSharedCostCents: costTotal(day.actual_costs ?? day.expected_costs) } : {}),
    feesPosted: day.status === 'closed',
  };
}

/** The printable day sheet of a day: every member of the co-op may print it (no money on it). */
export async function daySheet(actor: SessionUser, dayId: string): Promise<{ fileName: string; body: Buffer }> {
  const data = await withTenant(actor, async (tx) => {
    const day = await dayDetailIn(tx, actor, dayId);
    const bookings = (await listBookingsIn(tx, actor, dayId)).items;
    const summary = await summaryIn(tx, actor, dayId);
    const coop = await getCoop(actor.coopId, tx);
    return { day, bookings, summary, coopName: coop?.name ?? 'The co-op' };
  });
  return { fileName: `processing-day-${data.day.date}.pdf`, body: await daySheetPdf(data) };
}
