/**
 * The demo co-op's processing days (all invented): the co-op's site at Quillfeather, one day four days ago
 * with its bookings checked in, its yields recorded as each farm's processing records (live weight from the
 * group's last weigh-in plus about 35 g a day, dress-out 54–58 %) and its shared costs split, and one day in
 * nine days booked to within two places of its capacity. Groups under a withdrawal are left out, as the rules
 * require. Everything goes through the services; loaded once (the site marks it loaded).
 */
import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { addDays, daysBetween, processingDayCreateSchema, todayIn, type BookingDto } from '@burrowline/shared';
import type { SessionUser } from '../packages/server/src/lib/session-user';
import { withdrawalsCovering } from '../packages/server/src/modules/almanac/treatments.service';
import { growOutFactsOfFarm, growingGroupsReadyBy } from '../packages/server/src/modules/grow-out/grow-out-facts.service';
import { bookPlacesIn, checkInIn } from '../packages/server/src/modules/processing-days/bookings.service';
import { closeDayIn, recordDayYieldIn } from '../packages/server/src/modules/processing-days/day-close.service';
import { coopHasProcessingSites, createSiteIn, scheduleDayIn } from '../packages/server/src/modules/processing-days/processing-days.service';
import { seededRandom } from '../packages/shared/src/pedigree/seeded-random';

export interface DemoProcessingDaysContext {
  coopId: string;
  farms: Map<string, string>;
  keepers: Map<string, string>;
}

const ZONE = 'America/Chicago';

export async function loadDemoProcessingDays(ctx: DemoProcessingDaysContext, tx: Transaction, now: Date = new Date()): Promise<{ days: number; bookings: number } | null> {
  if (await coopHasProcessingSites(tx)) return null;
  const hostFarm = ctx.farms.get('quillfeather')!;
  const admin: SessionUser = { id: ctx.keepers.get('quillfeather')!, coopId: ctx.coopId, farmId: hostFarm, mentorId: null, email: 'admin@demo.test', name: 'Odalys Brenner', role: 'admin' };
  const keeperOf = (farmId: string): SessionUser => {
    const key = [...ctx.farms].find(([, id]) => id === farmId)![0];
    return { id: ctx.keepers.get(key)!, coopId: ctx.coopId, farmId, mentorId: null, email: `${key}@demo.test`, name: key, role: 'member' };
  };
  const random = seededRandom(20_261_205);
  const today = todayIn(ZONE, now);
  const site = await createSiteIn(tx, admin, {
    name: 'Quillfeather processing shed', hostFarmId: hostFarm, address: '418 Tamsin Valley Road, Fennick County', capacityHeadPerDay: 60,
    chillCapacityHead: 30, water: 'potable_well', hostMaySchedule: true, notes: 'Park by the hay barn. The shed has two sinks and a hose; bring your own coolers.',
  });

  /** Growing groups of every farm with a weigh-in, not under a withdrawal on `date`, with the heads they have. */
  async function eligibleGroups(date: string) {
    const result: { farmId: string; groupId: string; heads: number; gramsPerHead: number; lastWeighedOn: string }[] = [];
    for (const farmId of ctx.farms.values()) {
      const ready = await growingGroupsReadyBy(tx, ctx.coopId, farmId, date, today);
      const facts = await growOutFactsOfFarm(tx, ctx.coopId, farmId, { groupIds: ready.map((g) => g.id), withFeed: false });
      const withdrawn = (await withdrawalsCovering(tx, ctx.coopId, { groupIds: ready.map((g) => g.id) }, date)).groups;
      for (const g of ready) {
        const last = facts.find((f) => f.id === g.id)?.weighIns.at(-1);
        if (!last || withdrawn.has(g.id) || g.headsLeft < 2) continue;
        result.push({ farmId, groupId: g.id, heads: g.headsLeft, gramsPerHead: last.totalGrams / last.headCount, lastWeighedOn: last.weighedOn });
      }
    }
    return result;
  }

  // The day four days ago: booked, checked in, its yields recorded and closed.
  const pastDate = addDays(today, -4);
  const past = await scheduleDayIn(tx, admin, processingDayCreateSchema.parse({
    siteId: site.id, date: pastDate, startTime: '07:30', capacityHead: 40, signUpDeadline: addDays(pastDate, -3), feePerHeadCents: 350,
    expectedCosts: [{ label: 'Shrink bags', amountCents: 2_160 }, { label: 'Ice', amountCents: 3_000 }, { label: 'Propane', amountCents: 1_875 }, { label: 'Site fee', amountCents: 2_500 }],
    equipment: [{ name: 'Chill tank (150 qt)' }, { name: 'Scalder' }, { name: 'Gambrel hooks' }, { name: 'Scale (to 25 lb)' }],
    notes: 'Demo: the November day.',
  }), { allowPast: true });
  let bookings = 0;
  for (const g of (await eligibleGroups(pastDate)).slice(0, 4)) {
    const head = Math.min(3, g.heads);
    const { booking } = await bookPlacesIn(tx, admin, past.id, { idempotencyKey: randomUUID(), farmId: g.farmId, items: [{ groupId: g.groupId, head }] });
    bookings++;
    const inBatch = await checkInIn(tx, admin, past.id, booking.id, { version: booking.version, headBrought: head });
    const liveGrams = Math.round((g.gramsPerHead + 35 * Math.max(0, daysBetween(g.lastWeighedOn, pastDate))) * head);
    const hotCarcassGrams = Math.round(liveGrams * (0.54 + random() * 0.04));
    const condemned = bookings === 2 ? 1 : 0;
    await recordDayYieldIn(tx, keeperOf(g.farmId), past.id, {
      bookingId: inBatch.id, groupId: g.groupId, headCount: head, liveGrams, hotCarcassGrams, chilledCarcassGrams: Math.round(hotCarcassGrams * 0.98),
      trimmedHead: 0, condemnedHead: condemned, outcomeReason: condemned ? 'White spots on the liver: condemned, as the tularemia caution says' : '', notes: '',
    });
  }
  if (bookings > 0) await closeDayIn(tx, admin, past.id, { version: past.version, actualCosts: [{ label: 'Shrink bags', amountCents: 2_160 }, { label: 'Ice', amountCents: 3_400 }, { label: 'Propane', amountCents: 1_875 }, { label: 'Site fee', amountCents: 2_500 }] });

  // The day in nine days, booked to within two places of its capacity.
  const nextDate = addDays(today, 9);
  const groups = await eligibleGroups(nextDate);
  const lines = groups.map((g) => ({ ...g, head: Math.min(6, g.heads) }));
  const total = lines.reduce((n, l) => n + l.head, 0);
  const upcoming = await scheduleDayIn(tx, admin, processingDayCreateSchema.parse({
    siteId: site.id, date: nextDate, startTime: '07:00', capacityHead: Math.min(60, total + 2), signUpDeadline: addDays(nextDate, -3), feePerHeadCents: 350,
    expectedCosts: [{ label: 'Shrink bags', amountCents: 2_400 }, { label: 'Ice', amountCents: 3_200 }, { label: 'Propane', amountCents: 1_875 }, { label: 'Site fee', amountCents: 2_500 }],
    equipment: [{ name: 'Chill tank (150 qt)' }, { name: 'Second chill tank' }, { name: 'Gambrel hooks' }, { name: 'Scale (to 25 lb)' }, { name: 'Hand-wash station' }],
    notes: 'Demo: the December day. Bring coolers with ice for the ride home.',
  }));
  for (const l of lines) {
    const booked: BookingDto = (await bookPlacesIn(tx, admin, upcoming.id, { idempotencyKey: randomUUID(), farmId: l.farmId, items: [{ groupId: l.groupId, head: l.head }] })).booking;
    if (booked.status === 'booked') bookings++;
  }
  return { days: 2, bookings };
}
