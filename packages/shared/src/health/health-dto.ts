import type { PersonRefDto } from '../dto';
import type { AnimalRefDto } from '../almanac/almanac-dto';
import type { YieldFlag } from '../yield/dress-out';
import type { UsdaClass } from '../yield/usda-class';
import type { TreatmentRoute } from '../schemas/health.schema';

/** What the Health and Processing tabs receive. */

export interface GroupRefDto {
  id: string;
  name: string;
}

export interface TreatmentDto {
  id: string;
  /** The treated animal, or null when a grow-out group was treated. */
  animal: AnimalRefDto | null;
  group: GroupRefDto | null;
  treatment: string;
  dose: string;
  /** Null on treatments recorded before routes were kept. */
  route: TreatmentRoute | null;
  veterinarian: string;
  startedOn: string;
  /** The last day of treatment (null on treatments recorded before it was kept). */
  lastDoseOn: string | null;
  /** The last day under withdrawal: processing is allowed from the next day. */
  withdrawalEndsOn: string;
  /** Same as withdrawalEndsOn (kept for the breeding screens). */
  endsOn: string;
  /** Days of withdrawal after the last dose (0 = none); null when unknown. */
  withdrawalDays: number | null;
  /** The withdrawal covers today on the farm's clock. */
  underWithdrawal: boolean;
  notes: string;
  recordedBy: PersonRefDto | null;
}

export interface WithdrawalDto {
  treatmentId: string;
  animal: AnimalRefDto | null;
  group: GroupRefDto | null;
  treatment: string;
  veterinarian: string;
  withdrawalEndsOn: string;
  /** The first day it may be processed. */
  clearFrom: string;
}

export interface WithdrawalStateDto {
  today: string;
  /** Withdrawals covering today (of the one animal or group asked about, or all the farm's), longest first. */
  withdrawals: WithdrawalDto[];
}

export interface TemperatureReadingDto {
  id: string;
  takenAt: string;
  celsius: number;
  place: string;
  hot: boolean;
  recordedBy: PersonRefDto | null;
}

export interface HeatCautionDto {
  /** The latest reading of the last 24 hours is at or above 85 °F / 29.4 °C. */
  hot: boolean;
  thresholdCelsius: number;
  latest: TemperatureReadingDto | null;
  /** Does due to kindle within the week, and litters under 3 weeks old: most at risk. */
  dueToKindle: { doe: AnimalRefDto; dueOn: string }[];
  youngLitters: { litterId: string; dam: AnimalRefDto; kindledOn: string; ageDays: number; alive: number | null }[];
}

export interface TemperatureListDto {
  readings: TemperatureReadingDto[];
  heat: HeatCautionDto;
}

export interface ProcessingRecordDto {
  id: string;
  processedOn: string;
  animal: AnimalRefDto | null;
  group: GroupRefDto | null;
  headCount: number;
  ageDays: number | null;
  liveGrams: number;
  hotCarcassGrams: number;
  chilledCarcassGrams: number | null;
  hotDressOutPercent: number;
  chilledDressOutPercent: number | null;
  usdaClass: UsdaClass;
  usdaClassReason: string;
  usdaClassNote: string | null;
  /** Warnings kept with the record (figures outside the usual range). */
  flags: YieldFlag[];
  notes: string;
  recordedBy: PersonRefDto | null;
}

export interface ProcessingMarkDto {
  id: string;
  animal: AnimalRefDto | null;
  group: GroupRefDto | null;
  plannedOn: string;
  status: 'planned' | 'done' | 'cancelled';
  notes: string;
  /** A withdrawal recorded after the mark, still running: it cannot be processed before the day after. */
  withdrawalEndsOn: string | null;
  markedBy: PersonRefDto | null;
  version: number;
}

export interface ProcessingListDto {
  today: string;
  records: ProcessingRecordDto[];
  marks: ProcessingMarkDto[];
}
