import { randomUUID } from 'node:crypto';
import {
  addDays, processingDayCreateSchema, processingSiteCreateSchema,
  type ProcessingDayCreateBody, type ProcessingDayDto, type ProcessingSiteCreateBody, type ProcessingSiteDto,
} from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { createSite, scheduleDay } from '../../packages/server/src/modules/processing-days/processing-days.service';
import { farmToday } from './almanac';
import { asTenant } from './db';
import type { TestCoop, TestPerson } from './factories';
import { actorOf } from './herd';

export const inDays = (n: number) => addDays(farmToday(), n);

/** A site of the co-op hosted by farm 0 (the admin's and the member's farm). */
export async function siteAs(admin: TestPerson, coop: TestCoop, overrides: Partial<ProcessingSiteCreateBody> = {}): Promise<ProcessingSiteDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return createSite(actorOf(admin), processingSiteCreateSchema.parse({
    name: `Barn ${randomUUID().slice(0, 6)}`, hostFarmId: coop.farms[0]!.id, address: '12 Mill Lane, Test County', capacityHeadPerDay: 80,
    chillCapacityHead: 40, water: 'potable_well', ...overrides,
  }));
}

export function dayBody(siteId: string, overrides: Partial<ProcessingDayCreateBody> = {}): ProcessingDayCreateBody {
  return {
    siteId, date: inDays(14), startTime: '07:30', capacityHead: 20, signUpDeadline: inDays(10), feePerHeadCents: 150,
    expectedCosts: [{ label: 'Bags', amountCents: 1_800 }, { label: 'Ice', amountCents: 2_400 }], equipment: [{ name: 'Chill tank' }, { name: 'Propane burner' }],
    notes: 'Bring gloves.', ...overrides,
  };
}

/** A day scheduled through the service (its notices and reminders as the admin would send them). */
export async function dayAs(person: TestPerson, siteId: string, overrides: Partial<ProcessingDayCreateBody> = {}): Promise<ProcessingDayDto> {
  connectDatabase(process.env.DATABASE_URL!);
  return scheduleDay(actorOf(person), processingDayCreateSchema.parse(dayBody(siteId, overrides)));
}

/** Moves a day's dates as time passing would (the API refuses a deadline in the past). */
export async function moveDay(coopId: string, dayId: string, dates: { date?: string; deadline?: string }): Promise<void> {
  await asTenant(coopId, async (c) => {
    await c.query(
      'UPDATE processing_days SET date = COALESCE($2::date, date), sign_up_deadline = COALESCE($3::date, sign_up_deadline) WHERE id = $1',
      [dayId, dates.date ?? null, dates.deadline ?? null],
    );
  }, { commit: true });
}

export async function transfersOf(coopId: string, like: string) {
  return asTenant(coopId, async (c) => (await c.query(
    'SELECT id, kind, status, amount_cents::int AS amount_cents FROM ledger_transfers WHERE id LIKE $1 ORDER BY id', [like],
  )).rows as { id: string; kind: string; status: string; amount_cents: number }[]);
}

export async function bookingRows(coopId: string, dayId: string) {
  return asTenant(coopId, async (c) => (await c.query(
    'SELECT id, farm_id, status, head, queue_number::int AS queue_number FROM processing_bookings WHERE day_id = $1 ORDER BY queue_number', [dayId],
  )).rows as { id: string; farm_id: string; status: string; head: number; queue_number: number }[]);
}

export const bookingBody = (farmId: string, items: unknown[]) => ({ idempotencyKey: randomUUID(), farmId, items });
