import {
  PROCESSING_DAY_CAUTIONS, type BookingDto, type CapacityPictureDto, type EquipmentItemDto, type ProcessingDayDto, type ProcessingDayListItemDto,
  type ProcessingSiteDto, type StationDto,
} from '@burrowline/shared';
import { cents, type BookingRow, type DayRow, type SiteRow } from './processing-days-store';

export interface SitePresentContext {
  farmName: (farmId: string) => string;
}

export function presentSite(row: SiteRow, ctx: SitePresentContext): ProcessingSiteDto {
  return {
    id: row.id, name: row.name, hostFarmId: row.host_farm_id, hostFarmName: ctx.farmName(row.host_farm_id), address: row.address,
    capacityHeadPerDay: row.capacity_head_per_day, chillCapacityHead: row.chill_capacity_head, water: row.water,
    hostMaySchedule: row.host_may_schedule, notes: row.notes, version: row.version,
  };
}

export function presentCapacity(c: { capacityHead: number; bookedHead: number; offeredHead: number; waitlistedHead: number; freeHead: number }, chillCapacityHead: number): CapacityPictureDto {
  return { ...c, chillCapacityHead, overChillCapacity: c.bookedHead + c.offeredHead > chillCapacityHead };
}

export interface BookingPermissions {
  canChange: boolean;
  canCancel: boolean;
  canConfirm: boolean;
  canCheckIn: boolean;
}

export function presentBooking(row: BookingRow, o: { farmName: string; waitlistPosition: number | null; feePerHeadCents: number | null; can: BookingPermissions }): BookingDto {
  return {
    id: row.id, dayId: row.day_id, farmId: row.farm_id, farmName: o.farmName, status: row.status, head: row.head,
    lines: row.lines.map((l) => ({ groupId: l.groupId, animalId: l.animalId, label: l.label, head: l.head })),
    waitlistPosition: o.waitlistPosition,
    offerExpiresAt: row.offer_expires_at ? new Date(row.offer_expires_at).toISOString() : null,
    headBrought: row.head_brought, checkedInAt: row.checked_in_at ? new Date(row.checked_in_at).toISOString() : null,
    ...(o.feePerHeadCents === null ? {} : { feeCents: o.feePerHeadCents * row.head }),
    version: row.version, createdAt: new Date(row.created_at).toISOString(), ...o.can,
  };
}

export interface DayListContext {
  siteName: string;
  chillCapacityHead: number;
  hostFarmName: string;
  hostToday: string;
  capacity: { capacityHead: number; bookedHead: number; offeredHead: number; waitlistedHead: number; freeHead: number };
  myBookings: ProcessingDayListItemDto['myBookings'];
  seesMoney: boolean;
}

export function presentDayListItem(day: DayRow, ctx: DayListContext): ProcessingDayListItemDto {
  return {
    id: day.id, date: day.date, startTime: day.start_time, status: day.status, siteId: day.site_id, siteName: ctx.siteName,
    hostFarmId: day.host_farm_id, hostFarmName: ctx.hostFarmName, signUpDeadline: day.sign_up_deadline,
    deadlinePassed: ctx.hostToday > day.sign_up_deadline, capacity: presentCapacity(ctx.capacity, ctx.chillCapacityHead),
    myBookings: ctx.myBookings, ...(ctx.seesMoney ? { feePerHeadCents: cents(day.fee_per_head_cents) } : {}),
  };
}

export interface DayDetailContext extends DayListContext {
  site: ProcessingSiteDto;
  stations: StationDto[];
  equipment: EquipmentItemDto[];
  canEdit: boolean;
  canBook: boolean;
  canClose: boolean;
}

export function presentDay(day: DayRow, ctx: DayDetailContext): ProcessingDayDto {
  return {
    ...presentDayListItem(day, ctx),
    site: ctx.site,
    ...(ctx.seesMoney ? { expectedCosts: day.expected_costs, actualCosts: day.actual_costs } : {}),
    stations: ctx.stations, equipment: ctx.equipment, notes: day.notes, cautions: [...PROCESSING_DAY_CAUTIONS], version: day.version,
    canEdit: ctx.canEdit, canBook: ctx.canBook, canClose: ctx.canClose,
  };
}
