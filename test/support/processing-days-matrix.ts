import { randomUUID } from 'node:crypto';
import { bookingCreateSchema, processingDayCreateSchema } from '@burrowline/shared';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { bookPlaces } from '../../packages/server/src/modules/processing-days/bookings.service';
import { createSite, scheduleDay, setFarmSettings, signUpForStation } from '../../packages/server/src/modules/processing-days/processing-days.service';
import { asTenant } from './db';
import type { TestCoop } from './factories';
import { growingGroupAs } from './health-yield';
import { actorOf } from './herd';
import { dayBody, inDays } from './processing-days';

/** Objects of a processing day hosted by farm A, made fresh for every cell that may change them. */
export interface ProcessingDayIds {
  siteId?: string;
  dayId?: string;
  dayVersion?: number;
  stationId?: string;
  itemId?: string;
  groupId?: string;
  bookingId?: string;
  bookingVersion?: number;
  farmId?: string;
}

/** A site of farm A (its host may not schedule), a day there in two weeks, farm A's booking of 2 head, the member on the first station. */
export async function processingDayTarget(coop: TestCoop, target: string): Promise<ProcessingDayIds> {
  if (target !== 'dayA') return {};
  connectDatabase(process.env.DATABASE_URL!);
  const admin = actorOf(coop.admin);
  const site = await createSite(admin, { name: `Matrix barn ${randomUUID().slice(0, 8)}`, hostFarmId: coop.farms[0]!.id, address: '1 Matrix Lane', capacityHeadPerDay: 50, chillCapacityHead: 20, water: 'potable_mains', hostMaySchedule: false, notes: '' });
  const day = await scheduleDay(admin, processingDayCreateSchema.parse(dayBody(site.id, { capacityHead: 10 })));
  const { group } = await growingGroupAs(coop.member, { kindledDaysAgo: 70, heads: 6, name: `Matrix pen ${randomUUID().slice(0, 4)}` });
  const { booking } = await bookPlaces(actorOf(coop.member), day.id, bookingCreateSchema.parse({ idempotencyKey: randomUUID(), farmId: coop.farms[0]!.id, items: [{ groupId: group.id, head: 2 }] }));
  await signUpForStation(actorOf(coop.member), day.id, day.stations[0]!.id, {});
  // Another cell may have let farm A's apprentices staff the stations; each cell starts from the default.
  await setFarmSettings(actorOf(coop.member), coop.farms[0]!.id, { apprenticesMayStaff: false });
  return {
    siteId: site.id, dayId: day.id, dayVersion: day.version, stationId: day.stations[0]!.id, itemId: day.equipment[0]!.id, groupId: group.id,
    bookingId: booking.id, bookingVersion: booking.version, farmId: coop.farms[0]!.id,
  };
}

export function processingDayBody(coop: TestCoop, body: string | undefined, ids: ProcessingDayIds): object | undefined {
  switch (body) {
    case 'processingSite':
      return { name: `Matrix site ${randomUUID().slice(0, 8)}`, hostFarmId: coop.farms[0]!.id, address: '2 Matrix Lane', capacityHeadPerDay: 40, chillCapacityHead: 20, water: 'carried_in' };
    case 'processingSiteEdit':
      return { version: 0, notes: `Checked ${Date.now()}` };
    case 'processingFarmSettings':
      return { apprenticesMayStaff: true };
    case 'processingDay':
      return dayBody(ids.siteId ?? randomUUID(), { date: inDays(20), signUpDeadline: inDays(15) });
    case 'processingDayEdit':
      return { version: ids.dayVersion, notes: `Checked ${Date.now()}` };
    case 'processingBooking':
      return { idempotencyKey: randomUUID(), farmId: coop.farms[0]!.id, items: [{ groupId: ids.groupId, head: 1 }] };
    case 'processingBookingEdit':
      return { version: ids.bookingVersion, items: [{ groupId: ids.groupId, head: 1 }] };
    case 'processingBookingVersion':
      return { version: ids.bookingVersion };
    case 'processingCheckIn':
      return { version: ids.bookingVersion, headBrought: 2 };
    case 'processingRosterMember':
      return { userId: coop.member.id };
    case 'processingEquipmentClaim':
      return { farmId: coop.farms[0]!.id };
    case 'processingYield':
      return { bookingId: ids.bookingId, groupId: ids.groupId, headCount: 1, liveGrams: 2_300, hotCarcassGrams: 1_260 };
    case 'processingDayClose':
      return { version: ids.dayVersion };
    default:
      return undefined;
  }
}

/** What a refused call must leave as it was: the days, bookings, roster, equipment and yields. */
export async function processingDaysStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    sites: (await c.query('SELECT string_agg(id || \'=\' || version, \',\' ORDER BY id) AS s FROM processing_sites')).rows[0].s,
    days: (await c.query('SELECT string_agg(id || \'=\' || status || version, \',\' ORDER BY id) AS s FROM processing_days')).rows[0].s,
    bookings: (await c.query('SELECT string_agg(id || \'=\' || status || version, \',\' ORDER BY id) AS s FROM processing_bookings')).rows[0].s,
    roster: (await c.query('SELECT string_agg(station_id || \':\' || user_id, \',\' ORDER BY station_id, user_id) AS s FROM processing_day_roster')).rows[0].s,
    equipment: (await c.query('SELECT string_agg(id || \'=\' || coalesce(brought_by_farm_id::text, \'-\'), \',\' ORDER BY id) AS s FROM processing_day_equipment')).rows[0].s,
    settings: (await c.query('SELECT string_agg(farm_id || \'=\' || apprentices_may_staff, \',\' ORDER BY farm_id) AS s FROM processing_farm_settings')).rows[0].s,
    yields: (await c.query('SELECT count(*)::int AS n FROM processing_day_yields')).rows[0].n,
  }));
}
