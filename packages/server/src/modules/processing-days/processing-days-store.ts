import { QueryTypes, type Transaction } from 'sequelize';
import type { BookingStatus, CostLine, ProcessingDayStatus, WaterSupply } from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { AppError } from '../../lib/app-error';

/*
 * The rows of Processing Days, read and written with plain SQL: the day's row is locked by every change
 * of its bookings, so capacity is counted by one request at a time.
 */

export async function select<T extends object>(tx: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  return database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });
}

export interface SiteRow {
  id: string;
  host_farm_id: string;
  name: string;
  address: string;
  capacity_head_per_day: number;
  chill_capacity_head: number;
  water: WaterSupply;
  host_may_schedule: boolean;
  notes: string;
  version: number;
}

export const SITE_COLUMNS = 'id, host_farm_id, name, address, capacity_head_per_day, chill_capacity_head, water, host_may_schedule, notes, version';

export interface DayRow {
  id: string;
  coop_id: string;
  site_id: string;
  host_farm_id: string;
  date: string;
  start_time: string;
  capacity_head: number;
  sign_up_deadline: string;
  fee_per_head_cents: string | number;
  expected_costs: CostLine[];
  actual_costs: CostLine[] | null;
  notes: string;
  status: ProcessingDayStatus;
  scheduled_by: string | null;
  version: number;
}

export const DAY_COLUMNS = `d.id, d.coop_id, d.site_id, d.host_farm_id, to_char(d.date, 'YYYY-MM-DD') AS date, d.start_time, d.capacity_head,
  to_char(d.sign_up_deadline, 'YYYY-MM-DD') AS sign_up_deadline, d.fee_per_head_cents, d.expected_costs, d.actual_costs, d.notes, d.status,
  d.scheduled_by, d.version`;

export interface StoredLine {
  groupId: string | null;
  animalId: string | null;
  label: string;
  head: number;
}

export interface BookingRow {
  id: string;
  day_id: string;
  farm_id: string;
  idempotency_key: string;
  queue_number: string;
  status: BookingStatus;
  head: number;
  lines: StoredLine[];
  offer_expires_at: Date | null;
  fee_revision: number;
  head_brought: number | null;
  checked_in_at: Date | null;
  cancelled_reason: string | null;
  booked_by: string | null;
  version: number;
  created_at: Date;
}

export const BOOKING_COLUMNS = `b.id, b.day_id, b.farm_id, b.idempotency_key, b.queue_number, b.status, b.head, b.lines, b.offer_expires_at, b.fee_revision,
  b.head_brought, b.checked_in_at, b.cancelled_reason, b.booked_by, b.version, b.created_at`;

export const cents = (value: string | number) => Number(value);

/** The day, its row locked until commit: every booking, cancellation and capacity change goes through here. */
export async function lockDay(tx: Transaction, dayId: string): Promise<DayRow> {
  const [day] = await select<DayRow>(tx, `SELECT ${DAY_COLUMNS} FROM processing_days d WHERE d.id = $1 FOR UPDATE`, [dayId]);
  if (!day) throw AppError.notFound('That processing day');
  return day;
}

export async function findDayOrNull(tx: Transaction, dayId: string): Promise<DayRow | null> {
  const [day] = await select<DayRow>(tx, `SELECT ${DAY_COLUMNS} FROM processing_days d WHERE d.id = $1`, [dayId]);
  return day ?? null;
}

export async function findDay(tx: Transaction, dayId: string): Promise<DayRow> {
  const [day] = await select<DayRow>(tx, `SELECT ${DAY_COLUMNS} FROM processing_days d WHERE d.id = $1`, [dayId]);
  if (!day) throw AppError.notFound('That processing day');
  return day;
}

export async function findSite(tx: Transaction, siteId: string): Promise<SiteRow> {
  const [site] = await select<SiteRow>(tx, `SELECT ${SITE_COLUMNS} FROM processing_sites WHERE id = $1`, [siteId]);
  if (!site) throw AppError.notFound('That site');
  return site;
}

export async function bookingsOfDay(tx: Transaction, dayId: string): Promise<BookingRow[]> {
  return select<BookingRow>(tx, `SELECT ${BOOKING_COLUMNS} FROM processing_bookings b WHERE b.day_id = $1 ORDER BY b.queue_number`, [dayId]);
}

export async function findBooking(tx: Transaction, dayId: string, bookingId: string): Promise<BookingRow> {
  const [row] = await select<BookingRow>(tx, `SELECT ${BOOKING_COLUMNS} FROM processing_bookings b WHERE b.id = $1 AND b.day_id = $2`, [bookingId, dayId]);
  if (!row) throw AppError.notFound('That booking');
  return row;
}

export interface BookingPatch {
  status?: BookingStatus;
  head?: number;
  lines?: StoredLine[];
  offer_expires_at?: Date | null;
  fee_revision?: number;
  head_brought?: number | null;
  checked_in_at?: Date | null;
  cancelled_reason?: string | null;
}

/** Writes a booking's change and bumps its version; answers the row as it now is. */
export async function updateBooking(tx: Transaction, id: string, patch: BookingPatch): Promise<BookingRow> {
  const entries = Object.entries(patch);
  const sets = entries.map(([column], i) => `${column} = $${i + 2}${column === 'lines' ? '::jsonb' : ''}`);
  const values = entries.map(([column, value]) => (column === 'lines' ? JSON.stringify(value) : value));
  const [row] = await select<BookingRow>(
    tx,
    `UPDATE processing_bookings b SET ${[...sets, 'version = b.version + 1', 'updated_at = now()'].join(', ')} WHERE b.id = $1 RETURNING ${BOOKING_COLUMNS}`,
    [id, ...values],
  );
  return row!;
}

/** Places taken (booked and offered) and waiting, in head. */
export function capacityOf(day: Pick<DayRow, 'capacity_head'>, bookings: readonly Pick<BookingRow, 'status' | 'head'>[]) {
  const sum = (status: BookingStatus) => bookings.filter((b) => b.status === status).reduce((n, b) => n + b.head, 0);
  const bookedHead = sum('booked');
  const offeredHead = sum('offered');
  const waitlistedHead = sum('waitlisted');
  return { capacityHead: day.capacity_head, bookedHead, offeredHead, waitlistedHead, freeHead: Math.max(0, day.capacity_head - bookedHead - offeredHead) };
}
