import type { Transaction } from 'sequelize';
import {
  addDays, ErrorCode,
  type EquipmentItemDto, type ProcessingDayCreateInput, type ProcessingDayDto, type ProcessingDayListDto, type ProcessingDayListQuery,
  type ProcessingDayUpdateInput, type ProcessingFarmSettingsInput, type ProcessingSiteCreateInput, type ProcessingSiteDto,
  type ProcessingSiteUpdateInput, type RosterSignUpInput, type StationDto, type StationInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { enqueueJobIn, handleJobs } from '../../lib/mail-outbox';
import type { SessionUser } from '../../lib/session-user';
import { ensureCan } from '../farms/farm-access';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import { findUser } from '../users/users.service';
import { port } from '../../lib/port';
import { canBookFor, canHost, canSchedule, ensureSchedule, ensureSiteAdmin, isDayAdmin, seesMoney } from './day-access';
import { announceDay, noticeDayChanged, noticeDayScheduled, noticeReminder } from './day-notices';
import { presentCapacity, presentDay, presentDayListItem, presentSite } from './processing-days.presenter';
import {
  capacityOf, DAY_COLUMNS, findSite, findDayOrNull, lockDay, select, SITE_COLUMNS, type BookingRow, type DayRow, type SiteRow,
} from './processing-days-store';
import { promoteWaitlist } from './bookings.service';

/** The queue of reminders before the deadline and the day (created by migration 0074). */
export const REMINDER_QUEUE = 'processing-day-reminders';

export interface ReminderJob {
  coopId: string;
  dayId: string;
  which: 'deadline' | 'day-before';
}

/** The instants the reminders go out: 09:00 UTC the day before the deadline, and the day before the day. */
export function reminderInstant(day: Pick<DayRow, 'date' | 'sign_up_deadline'>, which: ReminderJob['which']): Date {
  return new Date(`${addDays(which === 'deadline' ? day.sign_up_deadline : day.date, -1)}T09:00:00Z`);
}

/**
 * A reminder run: the farms with places (before the deadline, also those waiting) are told once per person
 * and day, whichever worker or retry gets there first (the notice's key). A job queued for dates since moved
 * stays quiet; the job of the current dates does the work.
 */
export async function sendDayReminders(job: ReminderJob, now: Date = new Date()): Promise<number> {
  return withTenant({ coopId: job.coopId }, async (tx) => {
    const day = await findDayOrNull(tx, job.dayId);
    if (!day || day.status !== 'scheduled') return 0;
    if (now < reminderInstant(day, job.which)) return 0;
    // Too late to remind of a moment already past (a server down for days).
    if (now.toISOString().slice(0, 10) > (job.which === 'deadline' ? day.sign_up_deadline : day.date)) return 0;
    const statuses = job.which === 'deadline' ? ['booked', 'offered', 'waitlisted'] : ['booked'];
    const farms = await select<{ farm_id: string }>(tx, 'SELECT DISTINCT farm_id FROM processing_bookings WHERE day_id = $1 AND status = ANY($2::text[]) ORDER BY farm_id', [day.id, statuses]);
    if (farms.length === 0) return 0;
    const site = await findSite(tx, day.site_id);
    await noticeReminder(tx, { coopId: job.coopId, farmIds: farms.map((f) => f.farm_id), day, siteName: site.name, which: job.which });
    return farms.length;
  });
}

handleJobs<ReminderJob>(REMINDER_QUEUE, async (job) => {
  await sendDayReminders(job);
});

async function queueReminders(tx: Transaction, coopId: string, day: DayRow): Promise<void> {
  for (const which of ['deadline', 'day-before'] as const) {
    await enqueueJobIn(tx, REMINDER_QUEUE, { coopId, dayId: day.id, which } satisfies ReminderJob, { startAfter: reminderInstant(day, which) });
  }
}

// ---------------------------------------------------------------------------------------------
// Sites
// ---------------------------------------------------------------------------------------------

async function presentSites(tx: Transaction, coopId: string, rows: SiteRow[]): Promise<ProcessingSiteDto[]> {
  const directory = await farmDirectoryOf(coopId, tx);
  return rows.map((r) => presentSite(r, { farmName: (id) => directory.get(id)?.name ?? 'A former member farm' }));
}

export async function listSites(actor: SessionUser): Promise<ProcessingSiteDto[]> {
  return withTenant(actor, async (tx) => presentSites(tx, actor.coopId, await select<SiteRow>(tx, `SELECT ${SITE_COLUMNS} FROM processing_sites ORDER BY lower(name), id`)));
}

async function ensureHostFarm(tx: Transaction, coopId: string, farmId: string): Promise<void> {
  if (!(await farmDirectoryOf(coopId, tx)).has(farmId)) throw AppError.validation({ hostFarmId: ['Choose a farm of the co-op'] });
}

/** The admin adds a site: a member farm's place with its capacity a day, chill capacity and water. */
export async function createSite(actor: SessionUser, input: ProcessingSiteCreateInput): Promise<ProcessingSiteDto> {
  ensureSiteAdmin(actor);
  return withTenant(actor, (tx) => createSiteIn(tx, actor, input));
}

/** createSite inside the caller's transaction (the demo loader). */
export async function createSiteIn(tx: Transaction, actor: SessionUser, input: ProcessingSiteCreateInput): Promise<ProcessingSiteDto> {
  ensureSiteAdmin(actor);
  await ensureHostFarm(tx, actor.coopId, input.hostFarmId);
  const [row] = await select<SiteRow>(
    tx,
    `INSERT INTO processing_sites (coop_id, host_farm_id, name, address, capacity_head_per_day, chill_capacity_head, water, host_may_schedule, notes)
     VALUES (current_coop_id(), $1, $2, $3, $4, $5, $6, $7, $8)
     ON CONFLICT (coop_id, lower(name)) DO NOTHING RETURNING ${SITE_COLUMNS}`,
    [input.hostFarmId, input.name, input.address, input.capacityHeadPerDay, input.chillCapacityHead, input.water, input.hostMaySchedule, input.notes],
  );
  if (!row) throw AppError.conflict(`A site is already called ${input.name}`);
  return (await presentSites(tx, actor.coopId, [row]))[0]!;
}

/** Whether the co-op has any processing site yet (the demo loader adds its days once). */
export async function coopHasProcessingSites(tx: Transaction): Promise<boolean> {
  return (await select<{ id: string }>(tx, 'SELECT id FROM processing_sites LIMIT 1')).length > 0;
}

export async function updateSite(actor: SessionUser, siteId: string, input: ProcessingSiteUpdateInput): Promise<ProcessingSiteDto> {
  ensureSiteAdmin(actor);
  return withTenant(actor, async (tx) => {
    const site = await findSite(tx, siteId);
    if (site.version !== input.version) throw AppError.staleVersion();
    if (input.hostFarmId) await ensureHostFarm(tx, actor.coopId, input.hostFarmId);
    const next = {
      host_farm_id: input.hostFarmId ?? site.host_farm_id, name: input.name ?? site.name, address: input.address ?? site.address,
      capacity_head_per_day: input.capacityHeadPerDay ?? site.capacity_head_per_day, chill_capacity_head: input.chillCapacityHead ?? site.chill_capacity_head,
      water: input.water ?? site.water, host_may_schedule: input.hostMaySchedule ?? site.host_may_schedule, notes: input.notes ?? site.notes,
    };
    const [row] = await select<SiteRow>(
      tx,
      `UPDATE processing_sites SET host_farm_id = $2, name = $3, address = $4, capacity_head_per_day = $5, chill_capacity_head = $6, water = $7,
         host_may_schedule = $8, notes = $9, version = version + 1, updated_at = now()
       WHERE id = $1 AND version = $10 RETURNING ${SITE_COLUMNS}`,
      [siteId, next.host_farm_id, next.name, next.address, next.capacity_head_per_day, next.chill_capacity_head, next.water, next.host_may_schedule, next.notes, input.version],
    );
    if (!row) throw AppError.staleVersion();
    return (await presentSites(tx, actor.coopId, [row]))[0]!;
  });
}

// ---------------------------------------------------------------------------------------------
// Days
// ---------------------------------------------------------------------------------------------

function checkCapacity(errors: Record<string, string[]>, site: SiteRow, capacityHead: number): void {
  if (capacityHead > site.capacity_head_per_day) {
    (errors.capacityHead ??= []).push(`${site.name} handles at most ${site.capacity_head_per_day} head a day`);
  }
}

async function writeStations(tx: Transaction, dayId: string, stations: StationInput[]): Promise<void> {
  const existing = await select<{ id: string; places: number }>(tx, 'SELECT id, places FROM processing_day_stations WHERE day_id = $1 AND deleted_at IS NULL', [dayId]);
  const kept = new Set(stations.map((s) => s.id).filter(Boolean));
  for (const gone of existing.filter((e) => !kept.has(e.id))) {
    const [filled] = await select<{ n: number }>(tx, 'SELECT count(*)::int AS n FROM processing_day_roster WHERE station_id = $1', [gone.id]);
    if (filled!.n > 0) throw AppError.conflict('A station with people signed up cannot be removed; ask them to leave it first');
    await select(tx, 'UPDATE processing_day_stations SET deleted_at = now() WHERE id = $1', [gone.id]);
  }
  for (const [index, s] of stations.entries()) {
    if (s.id && existing.some((e) => e.id === s.id)) {
      const [over] = await select<{ n: number }>(tx, 'SELECT count(*)::int AS n FROM processing_day_roster WHERE station_id = $1 AND position > $2', [s.id, s.places]);
      if (over!.n > 0) throw AppError.conflict(`${s.name} has people signed up beyond ${s.places} places`);
      await select(tx, 'UPDATE processing_day_stations SET name = $2, position = $3, places = $4 WHERE id = $1', [s.id, s.name, index, s.places]);
    } else if (s.id) {
      throw AppError.validation({ stations: ['A station of another day cannot be moved here'] });
    } else {
      await select(tx, 'INSERT INTO processing_day_stations (coop_id, day_id, name, position, places) VALUES (current_coop_id(), $1, $2, $3, $4)', [dayId, s.name, index, s.places]);
    }
  }
}

async function writeEquipment(tx: Transaction, dayId: string, items: { id?: string; name: string }[]): Promise<void> {
  const existing = await select<{ id: string }>(tx, 'SELECT id FROM processing_day_equipment WHERE day_id = $1 AND deleted_at IS NULL', [dayId]);
  const kept = new Set(items.map((s) => s.id).filter(Boolean));
  for (const gone of existing.filter((e) => !kept.has(e.id))) await select(tx, 'UPDATE processing_day_equipment SET deleted_at = now() WHERE id = $1', [gone.id]);
  for (const [index, item] of items.entries()) {
    if (item.id && existing.some((e) => e.id === item.id)) await select(tx, 'UPDATE processing_day_equipment SET name = $2, position = $3 WHERE id = $1', [item.id, item.name, index]);
    else await select(tx, 'INSERT INTO processing_day_equipment (coop_id, day_id, name, position) VALUES (current_coop_id(), $1, $2, $3)', [dayId, item.name, index]);
  }
}

/**
 * The admin (or the site's host, when the admin allows it) schedules a day at a site: capacity within the
 * site's, a deadline on or before the day, a fee per head, expected shared costs, stations and equipment.
 * Every member of the co-op is told; reminders are queued for before the deadline and the day before.
 */
export async function scheduleDay(actor: SessionUser, input: ProcessingDayCreateInput): Promise<ProcessingDayDto> {
  return withTenant(actor, (tx) => scheduleDayIn(tx, actor, input));
}

export async function scheduleDayIn(tx: Transaction, actor: SessionUser, input: ProcessingDayCreateInput, opts: { allowPast?: boolean } = {}): Promise<ProcessingDayDto> {
  const site = await findSite(tx, input.siteId);
  ensureSchedule(actor, site);
  if (input.id) {
    const [existing] = await select<{ id: string }>(tx, 'SELECT id FROM processing_days WHERE id = $1', [input.id]);
    if (existing) return dayDetailIn(tx, actor, input.id);
  }
  const directory = await farmDirectoryOf(actor.coopId, tx);
  const hostToday = farmTodayIn(directory, site.host_farm_id);
  const errors: Record<string, string[]> = {};
  if (!opts.allowPast && input.signUpDeadline < hostToday) errors.signUpDeadline = [`The deadline ${input.signUpDeadline} has passed (today is ${hostToday})`];
  checkCapacity(errors, site, input.capacityHead);
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);
  const [day] = await select<DayRow>(
    tx,
    `INSERT INTO processing_days AS d (${input.id ? 'id, ' : ''}coop_id, site_id, host_farm_id, date, start_time, capacity_head, sign_up_deadline, fee_per_head_cents, expected_costs, notes, scheduled_by)
     VALUES (${input.id ? '$10, ' : ''}current_coop_id(), $1, $2, $3, $4, $5, $6, $7, $8::jsonb, $9, ${input.id ? '$11' : '$10'}) RETURNING ${DAY_COLUMNS}`,
    [
      site.id, site.host_farm_id, input.date, input.startTime, input.capacityHead, input.signUpDeadline, input.feePerHeadCents,
      JSON.stringify(input.expectedCosts), input.notes, ...(input.id ? [input.id] : []), actor.id,
    ],
  );
  await writeStations(tx, day!.id, input.stations);
  await writeEquipment(tx, day!.id, input.equipment);
  if (!opts.allowPast) {
    await queueReminders(tx, actor.coopId, day!);
    await noticeDayScheduled(tx, { coopId: actor.coopId, farmIds: [...directory.keys()], actorId: actor.id, day: day!, siteName: site.name });
  }
  announceDay(tx, actor.coopId, { dayId: day!.id, what: 'scheduled', capacity: capacityOf(day!, []) });
  return dayDetailIn(tx, actor, day!.id);
}

/** Changes a day: date, time, capacity (more places promote the waitlist; fewer than booked is refused), deadline, fee, stations, equipment. */
export async function updateDay(actor: SessionUser, dayId: string, input: ProcessingDayUpdateInput): Promise<ProcessingDayDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const site = await findSite(tx, day.site_id);
    ensureSchedule(actor, site, 'update');
    if (day.version !== input.version) throw AppError.staleVersion();
    if (day.status !== 'scheduled') throw AppError.conflict(`The day is ${day.status}; it can no longer change`);
    const bookings = await select<BookingRow>(tx, 'SELECT status, head, farm_id FROM processing_bookings WHERE day_id = $1 AND status <> \'cancelled\'', [dayId]);
    const before = capacityOf(day, bookings);
    const errors: Record<string, string[]> = {};
    const date = input.date ?? day.date;
    const deadline = input.signUpDeadline ?? day.sign_up_deadline;
    if (deadline > date) errors.signUpDeadline = ['The sign-up deadline must be on or before the day'];
    if (input.capacityHead !== undefined) {
      checkCapacity(errors, site, input.capacityHead);
      if (input.capacityHead < before.bookedHead + before.offeredHead) {
        errors.capacityHead = [`${before.bookedHead + before.offeredHead} head are booked or offered; the capacity cannot go below that`];
      }
    }
    if (input.feePerHeadCents !== undefined && input.feePerHeadCents !== Number(day.fee_per_head_cents) && bookings.some((b) => b.status === 'booked')) {
      errors.feePerHeadCents = ['Farms have booked at this fee; it cannot change now'];
    }
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const [updated] = await select<DayRow>(
      tx,
      `UPDATE processing_days d SET date = $2, start_time = $3, capacity_head = $4, sign_up_deadline = $5, fee_per_head_cents = $6,
         expected_costs = $7::jsonb, notes = $8, version = d.version + 1, updated_at = now()
       WHERE d.id = $1 RETURNING ${DAY_COLUMNS}`,
      [
        dayId, date, input.startTime ?? day.start_time, input.capacityHead ?? day.capacity_head, deadline,
        input.feePerHeadCents ?? day.fee_per_head_cents, JSON.stringify(input.expectedCosts ?? day.expected_costs), input.notes ?? day.notes,
      ],
    );
    if (input.stations) await writeStations(tx, dayId, input.stations);
    if (input.equipment) await writeEquipment(tx, dayId, input.equipment);
    const changes: string[] = [];
    if (updated!.date !== day.date) changes.push(`the date is now ${updated!.date}`);
    if (updated!.start_time !== day.start_time) changes.push(`it starts at ${updated!.start_time}`);
    if (updated!.sign_up_deadline !== day.sign_up_deadline) changes.push(`bookings close on ${updated!.sign_up_deadline}`);
    if (updated!.capacity_head !== day.capacity_head) changes.push(`${updated!.capacity_head} places`);
    if (updated!.date !== day.date || updated!.sign_up_deadline !== day.sign_up_deadline) await queueReminders(tx, actor.coopId, updated!);
    if (changes.length > 0) {
      const farmIds = [...new Set(bookings.map((b) => b.farm_id))];
      await noticeDayChanged(tx, { coopId: actor.coopId, farmIds, actorId: actor.id, day: updated!, siteName: site.name, what: changes.join('; ') });
    }
    // More places: the waitlist moves up in its order.
    const capacity = updated!.capacity_head > day.capacity_head ? await promoteWaitlist(tx, actor.coopId, updated!, site.name) : capacityOf(updated!, bookings);
    announceDay(tx, actor.coopId, { dayId, what: updated!.capacity_head !== day.capacity_head ? 'capacity' : 'changed', capacity });
    return dayDetailIn(tx, actor, dayId);
  });
}

interface DayListRow extends DayRow {
  site_name: string;
  chill_capacity_head: number;
  booked_head: number;
  offered_head: number;
  waitlisted_head: number;
  my_bookings: { id: string; farmId: string; status: BookingRow['status']; head: number }[] | null;
  total: number;
}

/** Upcoming (from the earliest today of the co-op's clocks), past or all days, a page at a time, with the capacity and the asker's bookings. */
export async function listDays(actor: SessionUser, q: ProcessingDayListQuery): Promise<ProcessingDayListDto> {
  return withTenant(actor, async (tx) => {
    const directory = await farmDirectoryOf(actor.coopId, tx);
    const today = farmTodayIn(directory, actor.farmId);
    const where = q.when === 'upcoming' ? 'd.date >= $1::date' : q.when === 'past' ? 'd.date < $1::date' : '$1::date IS NOT NULL';
    const order = q.when === 'past' ? 'd.date DESC, d.start_time DESC, d.id DESC' : 'd.date ASC, d.start_time ASC, d.id ASC';
    const rows = await select<DayListRow>(
      tx,
      `SELECT ${DAY_COLUMNS}, s.name AS site_name, s.chill_capacity_head, count(*) OVER ()::int AS total,
         COALESCE(c.booked, 0)::int AS booked_head, COALESCE(c.offered, 0)::int AS offered_head, COALESCE(c.waitlisted, 0)::int AS waitlisted_head, c.mine AS my_bookings
       FROM processing_days d JOIN processing_sites s ON s.id = d.site_id
       LEFT JOIN LATERAL (
         SELECT sum(b.head) FILTER (WHERE b.status = 'booked') AS booked, sum(b.head) FILTER (WHERE b.status = 'offered') AS offered,
                sum(b.head) FILTER (WHERE b.status = 'waitlisted') AS waitlisted,
                json_agg(json_build_object('id', b.id, 'farmId', b.farm_id, 'status', b.status, 'head', b.head) ORDER BY b.queue_number) FILTER (WHERE b.farm_id = $2::uuid) AS mine
         FROM processing_bookings b WHERE b.day_id = d.id AND b.status <> 'cancelled'
       ) c ON true
       WHERE d.status <> 'cancelled' AND ${where}
       ORDER BY ${order} LIMIT $3 OFFSET $4`,
      [today, actor.farmId, q.pageSize, (q.page - 1) * q.pageSize],
    );
    let total = rows[0]?.total ?? 0;
    if (rows.length === 0 && q.page > 1) {
      const [count] = await select<{ n: number }>(tx, `SELECT count(*)::int AS n FROM processing_days d WHERE d.status <> 'cancelled' AND ${where}`, [today]);
      total = count!.n;
    }
    const money = seesMoney(actor);
    return {
      items: rows.map((r) => presentDayListItem(r, {
        siteName: r.site_name, chillCapacityHead: r.chill_capacity_head, hostFarmName: directory.get(r.host_farm_id)?.name ?? 'A former member farm',
        hostToday: farmTodayIn(directory, r.host_farm_id),
        capacity: capacityOf(r, [{ status: 'booked', head: r.booked_head }, { status: 'offered', head: r.offered_head }, { status: 'waitlisted', head: r.waitlisted_head }]),
        myBookings: r.my_bookings ?? [], seesMoney: money,
      })),
      total, page: q.page, pageSize: q.pageSize,
    };
  });
}

export async function getDay(actor: SessionUser, dayId: string): Promise<ProcessingDayDto> {
  return withTenant(actor, (tx) => dayDetailIn(tx, actor, dayId));
}

interface RosterJoinRow {
  station_id: string;
  name: string;
  places: number;
  position: number | null;
  user_id: string | null;
  user_name: string | null;
  farm_id: string | null;
}

/** The day's page: five reads whatever the number of bookings, stations and people. */
export async function dayDetailIn(tx: Transaction, actor: SessionUser, dayId: string): Promise<ProcessingDayDto> {
  const [row] = await select<DayRow & { site: SiteRow }>(
    tx,
    `SELECT ${DAY_COLUMNS}, row_to_json(s) AS site FROM processing_days d
     JOIN (SELECT ${SITE_COLUMNS} FROM processing_sites) s ON s.id = d.site_id WHERE d.id = $1`,
    [dayId],
  );
  if (!row) throw AppError.notFound('That processing day');
  const bookings = await select<Pick<BookingRow, 'id' | 'farm_id' | 'status' | 'head'>>(
    tx, 'SELECT id, farm_id, status, head FROM processing_bookings WHERE day_id = $1 AND status <> \'cancelled\' ORDER BY queue_number', [dayId],
  );
  const roster = await select<RosterJoinRow>(
    tx,
    `SELECT st.id AS station_id, st.name, st.places, r.position, r.user_id, u.name AS user_name, r.farm_id
     FROM processing_day_stations st LEFT JOIN processing_day_roster r ON r.station_id = st.id LEFT JOIN users u ON u.id = r.user_id
     WHERE st.day_id = $1 AND st.deleted_at IS NULL ORDER BY st.position, st.id, r.position`,
    [dayId],
  );
  const equipment = await select<{ id: string; name: string; brought_by_farm_id: string | null }>(
    tx, 'SELECT id, name, brought_by_farm_id FROM processing_day_equipment WHERE day_id = $1 AND deleted_at IS NULL ORDER BY position, id', [dayId],
  );
  const directory = await farmDirectoryOf(actor.coopId, tx);
  const farmName = (id: string) => directory.get(id)?.name ?? 'A former member farm';
  const stations = new Map<string, StationDto>();
  for (const r of roster) {
    const station = stations.get(r.station_id) ?? { id: r.station_id, name: r.name, places: [], filled: 0 };
    stations.set(r.station_id, station);
    if (r.position !== null) station.filled += 1;
    if (station.places.length === 0) {
      for (let p = 1; p <= r.places; p++) station.places.push({ id: `${r.station_id}:${p}`, position: p, userId: null, userName: null, farmId: null });
    }
    const place = r.position !== null ? station.places[r.position - 1] : undefined;
    if (place) Object.assign(place, { userId: r.user_id, userName: r.user_name, farmId: r.farm_id });
  }
  const items: EquipmentItemDto[] = equipment.map((e) => ({
    id: e.id, name: e.name, broughtByFarmId: e.brought_by_farm_id, broughtByFarmName: e.brought_by_farm_id ? farmName(e.brought_by_farm_id) : null,
  }));
  const hostToday = farmTodayIn(directory, row.host_farm_id);
  const scheduled = row.status === 'scheduled';
  return presentDay(row, {
    site: presentSite(row.site, { farmName }), siteName: row.site.name, chillCapacityHead: row.site.chill_capacity_head,
    hostFarmName: farmName(row.host_farm_id), hostToday, capacity: capacityOf(row, bookings),
    myBookings: bookings.filter((b) => b.farm_id === actor.farmId).map((b) => ({ id: b.id, farmId: b.farm_id, status: b.status, head: b.head })),
    seesMoney: seesMoney(actor), stations: [...stations.values()], equipment: items,
    canEdit: scheduled && canSchedule(actor, row.site, 'update'),
    canBook: scheduled && Boolean(actor.farmId) && canBookFor(actor, actor.farmId!) && hostToday <= row.sign_up_deadline,
    canClose: scheduled && (isDayAdmin(actor) || canHost(actor, row)) && hostToday >= row.date,
  });
}

// ---------------------------------------------------------------------------------------------
// Roster and equipment
// ---------------------------------------------------------------------------------------------

async function apprenticesMayStaff(tx: Transaction, farmId: string): Promise<boolean> {
  const [row] = await select<{ apprentices_may_staff: boolean }>(tx, 'SELECT apprentices_may_staff FROM processing_farm_settings WHERE farm_id = $1', [farmId]);
  return row?.apprentices_may_staff ?? false;
}

/**
 * Why an apprentice may not take a station yet, or null: the co-op's sign-off rule for dangerous stations,
 * from Mentorship (which builds on the herd, so it is plugged in at the composition root).
 */
export const stationRefusal = port<(tx: Transaction, coopId: string, apprenticeId: string, stationName: string) => Promise<string | null>>(
  'station refusal', async () => null,
);

/**
 * A person takes the first empty place of a station (one place a day each). Apprentices only when their
 * farm lets its apprentices staff the stations. The admin or host may put someone of the co-op on it.
 */
export async function signUpForStation(actor: SessionUser, dayId: string, stationId: string, input: RosterSignUpInput): Promise<ProcessingDayDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    if (day.status !== 'scheduled') throw AppError.conflict(`The day is ${day.status}; the roster is closed`);
    const [station] = await select<{ id: string; name: string; places: number }>(tx, 'SELECT id, name, places FROM processing_day_stations WHERE id = $1 AND day_id = $2 AND deleted_at IS NULL', [stationId, dayId]);
    if (!station) throw AppError.notFound('That station');
    let person: { id: string; farmId: string | null; role: string; coopId: string } = actor;
    if (input.userId && input.userId !== actor.id) {
      if (!isDayAdmin(actor) && !canHost(actor, day)) throw new AppError(ErrorCode.forbidden, 403, 'Only the admin or the host puts someone else on the roster');
      const other = await findUser(input.userId, tx);
      if (!other || other.coopId !== actor.coopId || other.disabledAt) throw AppError.validation({ userId: ['Choose someone of the co-op'] });
      person = other;
    }
    if (person.role === 'apprentice' && !(person.farmId && (await apprenticesMayStaff(tx, person.farmId)))) {
      throw new AppError(ErrorCode.forbidden, 403, 'Apprentices staff the stations only when their farm allows it');
    }
    const refusal = person.role === 'apprentice' ? await stationRefusal(tx, actor.coopId, person.id, station.name) : null;
    if (refusal) throw new AppError(ErrorCode.forbidden, 403, refusal);
    const taken = await select<{ position: number; user_id: string; station_id: string }>(tx, 'SELECT position, user_id, station_id FROM processing_day_roster WHERE day_id = $1', [dayId]);
    const own = taken.find((t) => t.user_id === person.id);
    if (own) throw AppError.conflict(own.station_id === stationId ? 'Already on this station' : 'Already on another station this day; leave it first');
    const used = new Set(taken.filter((t) => t.station_id === stationId).map((t) => t.position));
    let position = 1;
    while (used.has(position)) position++;
    if (position > station.places) throw AppError.conflict(`${station.name} is full`);
    await select(tx, 'INSERT INTO processing_day_roster (coop_id, day_id, station_id, position, user_id, farm_id) VALUES (current_coop_id(), $1, $2, $3, $4, $5)', [dayId, stationId, position, person.id, person.farmId]);
    announceDay(tx, actor.coopId, { dayId, what: 'roster', capacity: capacityOf(day, await select<BookingRow>(tx, 'SELECT status, head FROM processing_bookings WHERE day_id = $1', [dayId])) });
    return dayDetailIn(tx, actor, dayId);
  });
}

/** Leaves a station: the person on it, or the admin or host for anyone (`userId`). */
export async function leaveStation(actor: SessionUser, dayId: string, stationId: string, input: RosterSignUpInput): Promise<ProcessingDayDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const userId = input.userId ?? actor.id;
    if (userId !== actor.id && !isDayAdmin(actor) && !canHost(actor, day)) throw new AppError(ErrorCode.forbidden, 403, 'Only the admin or the host takes someone else off the roster');
    const removed = await select<{ id: string }>(tx, 'DELETE FROM processing_day_roster WHERE day_id = $1 AND station_id = $2 AND user_id = $3 RETURNING id', [dayId, stationId, userId]);
    if (removed.length === 0) throw AppError.notFound('That place on the roster');
    announceDay(tx, actor.coopId, { dayId, what: 'roster', capacity: capacityOf(day, await select<BookingRow>(tx, 'SELECT status, head FROM processing_bookings WHERE day_id = $1', [dayId])) });
    return dayDetailIn(tx, actor, dayId);
  });
}

/** A farm with places on the day (or the host) says it brings an item; the host sees who brings what. */
export async function claimEquipment(actor: SessionUser, dayId: string, itemId: string, farmId: string): Promise<ProcessingDayDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    if (!canBookFor(actor, farmId)) throw new AppError(ErrorCode.forbidden, 403, 'Only the farm\'s members say what it brings');
    const [active] = await select<{ n: number }>(tx, 'SELECT count(*)::int AS n FROM processing_bookings WHERE day_id = $1 AND farm_id = $2 AND status IN (\'booked\', \'offered\')', [dayId, farmId]);
    if (active!.n === 0 && farmId !== day.host_farm_id) throw AppError.conflict('Book places on the day before bringing equipment');
    const [item] = await select<{ id: string; brought_by_farm_id: string | null }>(tx, 'SELECT id, brought_by_farm_id FROM processing_day_equipment WHERE id = $1 AND day_id = $2 AND deleted_at IS NULL', [itemId, dayId]);
    if (!item) throw AppError.notFound('That item');
    if (item.brought_by_farm_id && item.brought_by_farm_id !== farmId) throw AppError.conflict('Another farm already brings it');
    await select(tx, 'UPDATE processing_day_equipment SET brought_by_farm_id = $2 WHERE id = $1', [itemId, farmId]);
    announceDay(tx, actor.coopId, { dayId, what: 'roster', capacity: capacityOf(day, await select<BookingRow>(tx, 'SELECT status, head FROM processing_bookings WHERE day_id = $1', [dayId])) });
    return dayDetailIn(tx, actor, dayId);
  });
}

export async function releaseEquipment(actor: SessionUser, dayId: string, itemId: string): Promise<ProcessingDayDto> {
  return withTenant(actor, async (tx) => {
    const day = await lockDay(tx, dayId);
    const [item] = await select<{ id: string; brought_by_farm_id: string | null }>(tx, 'SELECT id, brought_by_farm_id FROM processing_day_equipment WHERE id = $1 AND day_id = $2 AND deleted_at IS NULL', [itemId, dayId]);
    if (!item) throw AppError.notFound('That item');
    const mayRelease = isDayAdmin(actor) || canHost(actor, day) || (item.brought_by_farm_id !== null && canBookFor(actor, item.brought_by_farm_id));
    if (!mayRelease) throw new AppError(ErrorCode.forbidden, 403, 'Only the farm bringing it, the host or the admin changes that');
    await select(tx, 'UPDATE processing_day_equipment SET brought_by_farm_id = NULL WHERE id = $1', [itemId]);
    announceDay(tx, actor.coopId, { dayId, what: 'roster', capacity: capacityOf(day, await select<BookingRow>(tx, 'SELECT status, head FROM processing_bookings WHERE day_id = $1', [dayId])) });
    return dayDetailIn(tx, actor, dayId);
  });
}

// ---------------------------------------------------------------------------------------------
// A farm's setting
// ---------------------------------------------------------------------------------------------

export async function getFarmSettings(actor: SessionUser, farmId: string): Promise<{ farmId: string; apprenticesMayStaff: boolean }> {
  ensureCan(actor, 'read', 'ProcessingBooking', { farmId }, 'That farm', 'Only the farm\'s people see its settings');
  return withTenant(actor, async (tx) => {
    if (!(await farmDirectoryOf(actor.coopId, tx)).has(farmId)) throw AppError.notFound('That farm');
    return { farmId, apprenticesMayStaff: await apprenticesMayStaff(tx, farmId) };
  });
}

/** The farm's members (the apprentices' mentors) decide whether its apprentices may staff the stations. */
export async function setFarmSettings(actor: SessionUser, farmId: string, input: ProcessingFarmSettingsInput): Promise<{ farmId: string; apprenticesMayStaff: boolean }> {
  ensureCan(actor, 'manage', 'ProcessingBooking', { farmId }, 'That farm', 'Only the farm\'s members decide what its apprentices may do');
  return withTenant(actor, async (tx) => {
    if (!(await farmDirectoryOf(actor.coopId, tx)).has(farmId)) throw AppError.notFound('That farm');
    await select(
      tx,
      `INSERT INTO processing_farm_settings (farm_id, coop_id, apprentices_may_staff) VALUES ($1, current_coop_id(), $2)
       ON CONFLICT (farm_id) DO UPDATE SET apprentices_may_staff = EXCLUDED.apprentices_may_staff, updated_at = now()`,
      [farmId, input.apprenticesMayStaff],
    );
    return { farmId, apprenticesMayStaff: input.apprenticesMayStaff };
  });
}

export { presentCapacity };

// ---------------------------------------------------------------------------------------------
// For the Almanac, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

/** The processing days a farm has places on (booked or offered) or hosts, between two dates: its Almanac and calendar feed show them. */
export async function processingDaysOfFarm(tx: Transaction, _coopId: string, farmId: string, from: string, to: string) {
  const rows = await select<{ id: string; date: string; start_time: string; version: number; site_name: string; address: string; head: number | null; host: boolean }>(
    tx,
    `SELECT d.id, to_char(d.date, 'YYYY-MM-DD') AS date, d.start_time, d.version, s.name AS site_name, s.address,
            (SELECT sum(b.head)::int FROM processing_bookings b WHERE b.day_id = d.id AND b.farm_id = $1 AND b.status IN ('booked', 'offered')) AS head,
            d.host_farm_id = $1 AS host
     FROM processing_days d JOIN processing_sites s ON s.id = d.site_id
     WHERE d.status <> 'cancelled' AND d.date BETWEEN $2::date AND $3::date
       AND (d.host_farm_id = $1 OR EXISTS (SELECT 1 FROM processing_bookings b WHERE b.day_id = d.id AND b.farm_id = $1 AND b.status IN ('booked', 'offered')))
     ORDER BY d.date, d.start_time, d.id`,
    [farmId, from, to],
  );
  return rows.map((r) => ({
    id: r.id, date: r.date, startTime: r.start_time, version: r.version, link: `/processing-days/${r.id}`,
    title: `Processing day ${r.start_time} at ${r.site_name}${r.head ? ` (${r.head} head booked)` : ''}${r.host ? ', hosting' : ''}`,
    description: `Shared processing day at ${r.site_name}, ${r.address}. Starts ${r.start_time}. Gloves when dressing; chill carcasses promptly to 40 °F / 4.4 °C or below.`,
  }));
}
