import type { BookingStatus, CarcassOutcome, CostLine, ProcessingDayStatus, WaterSupply } from '../schemas/processing-days.schema';

/** What Processing Days answers. Fees and costs are cents; apprentices get the day without any money field. */

export interface ProcessingSiteDto {
  id: string;
  name: string;
  hostFarmId: string;
  hostFarmName: string;
  address: string;
  capacityHeadPerDay: number;
  chillCapacityHead: number;
  water: WaterSupply;
  hostMaySchedule: boolean;
  notes: string;
  version: number;
}

/** A bar of booked, offered (held for a promoted member), waitlisted and free places. */
export interface CapacityPictureDto {
  capacityHead: number;
  bookedHead: number;
  offeredHead: number;
  waitlistedHead: number;
  freeHead: number;
  chillCapacityHead: number;
  /** More booked than the chill tanks hold at once: chill in rounds. */
  overChillCapacity: boolean;
}

export interface RosterPlaceDto {
  id: string;
  position: number;
  userId: string | null;
  userName: string | null;
  farmId: string | null;
}

export interface StationDto {
  id: string;
  name: string;
  places: RosterPlaceDto[];
  filled: number;
}

export interface EquipmentItemDto {
  id: string;
  name: string;
  broughtByFarmId: string | null;
  broughtByFarmName: string | null;
}

export interface BookingLineDto {
  groupId: string | null;
  animalId: string | null;
  /** The group's name or the animal's ear tag and name. */
  label: string;
  head: number;
}

export interface BookingDto {
  id: string;
  dayId: string;
  farmId: string;
  farmName: string;
  status: BookingStatus;
  head: number;
  lines: BookingLineDto[];
  /** Place in the waitlist (1 = next), null unless waitlisted. */
  waitlistPosition: number | null;
  /** Until when a promoted member may confirm. */
  offerExpiresAt: string | null;
  headBrought: number | null;
  checkedInAt: string | null;
  /** Absent for who may not see money. */
  feeCents?: number;
  version: number;
  createdAt: string;
  canChange: boolean;
  canCancel: boolean;
  canConfirm: boolean;
  canCheckIn: boolean;
}

export interface CautionDto {
  id: string;
  title: string;
  text: string;
  /** The publication the figure comes from, or "common practice". */
  source: string;
}

export interface ProcessingDayListItemDto {
  id: string;
  date: string;
  startTime: string;
  status: ProcessingDayStatus;
  siteId: string;
  siteName: string;
  hostFarmId: string;
  hostFarmName: string;
  signUpDeadline: string;
  deadlinePassed: boolean;
  capacity: CapacityPictureDto;
  /** The asking person's farms' bookings on this day (not cancelled). */
  myBookings: Array<{ id: string; farmId: string; status: BookingStatus; head: number }>;
  feePerHeadCents?: number;
}

export interface ProcessingDayListDto {
  items: ProcessingDayListItemDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ProcessingDayDto extends ProcessingDayListItemDto {
  site: ProcessingSiteDto;
  expectedCosts?: CostLine[];
  actualCosts?: CostLine[] | null;
  stations: StationDto[];
  equipment: EquipmentItemDto[];
  notes: string;
  cautions: CautionDto[];
  version: number;
  canEdit: boolean;
  canBook: boolean;
  canClose: boolean;
}

export interface BookingListDto {
  items: BookingDto[];
  total: number;
}

/** A group or cull the member may bring, in the order the projection says they reach target by the day. */
export interface BookingCandidateDto {
  groupId: string | null;
  animalId: string | null;
  label: string;
  headAvailable: number;
  /** The projection's date for the target weight (groups), null when unknown. */
  projectedReadyOn: string | null;
  readyByDay: boolean;
  /** Under a medicine withdrawal on the day: the first date it may be processed. */
  eligibleOn: string | null;
  eligible: boolean;
}

export interface BookingCandidatesDto {
  dayId: string;
  date: string;
  items: BookingCandidateDto[];
}

export interface DaySummaryFarmDto {
  farmId: string;
  farmName: string;
  headBooked: number;
  headBrought: number;
  headProcessed: number;
  liveGrams: number;
  hotCarcassGrams: number;
  /** Hot carcass over live, 0–1; null without weights. */
  dressOut: number | null;
  trimmedHead: number;
  condemnedHead: number;
  feeCents?: number;
  sharedCostCents?: number;
}

export interface DaySummaryBreedDto {
  /** The breed or cross label. */
  label: string;
  headProcessed: number;
  dressOut: number | null;
}

export interface DayOutcomeDto {
  farmId: string;
  farmName: string;
  outcome: CarcassOutcome;
  head: number;
  reason: string;
}

export interface ProcessingDaySummaryDto {
  dayId: string;
  date: string;
  status: ProcessingDayStatus;
  headProcessed: number;
  farms: DaySummaryFarmDto[];
  byBreed: DaySummaryBreedDto[];
  outcomes: DayOutcomeDto[];
  totalSharedCostCents?: number;
  feesPosted: boolean;
}
