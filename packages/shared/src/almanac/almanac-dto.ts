import type { CycleSettings, CycleSettingSource } from '../breeding/cycle-settings';
import type { LitterEventKind, LitterSummary } from '../breeding/litter-count';
import type { KindlingStatus, PlannedTaskKind, TaskAnchor, TaskAttention, TaskState, TaskTiming } from '../breeding/plan';
import type { BreedingCheck } from '../breeding/validate';
import type { KitDeathCause } from '../breeding/breeding-record';
import type { PersonRefDto } from '../dto';
import type { FarmRefDto } from '../herd/herd-dto';
import type { ReviewState, Sex } from '../herd/herd-enums';
import type { HousingKind } from '../schemas/litter.schema';

/** What the Almanac and litter screens receive. */

export interface AnimalRefDto {
  id: string;
  name: string;
  tattoo: string | null;
  sex: Sex;
  /** The farm keeping it (another farm's for a buck on loan, or a fostered litter's dam). */
  farm: FarmRefDto | null;
}

export interface AlmanacTaskDto {
  /** Stable for the task's life: the calendar feed's UID. */
  id: string;
  farmId: string;
  kind: PlannedTaskKind;
  /** Stable within its record: the kind, or `weigh_in:<age>`. */
  key: string;
  /** The job in the product's words, e.g. "Palpate". */
  title: string;
  /** Whom it is about, e.g. "Larkin (QF-3)". */
  subject: string;
  dueOn: string;
  windowStart: string | null;
  windowEnd: string | null;
  anchor: TaskAnchor;
  anchorDate: string;
  /** Litter age at a weigh-in. */
  ageDays: number | null;
  state: TaskState;
  stateReason: string | null;
  /** The planned date a moved task came from. */
  movedFrom: string | null;
  doneOn: string | null;
  doneBy: PersonRefDto | null;
  /** An apprentice's tick waits for the mentor's review; a returned one is open again. */
  completionReview: ReviewState;
  reviewComment: string | null;
  timing: TaskTiming;
  daysLate: number;
  serviceId: string | null;
  litterId: string | null;
  animal: AnimalRefDto | null;
  version: number;
}

export interface AgendaDto {
  farm: FarmRefDto;
  timeZone: string;
  /** Today on the farm's clock. */
  today: string;
  from: string;
  to: string;
  tasks: AlmanacTaskDto[];
  /** Open tasks due before `from` (always shown on top of the agenda). */
  overdue: AlmanacTaskDto[];
  /** What must surface by itself: missed palpations, kindlings overdue or missed, late weanings. */
  attention: TaskAttention[];
  /** Apprentices' ticks and litter counts waiting for a member's review. */
  pendingReview: number;
}

/** Shared days the farm booked or hosts (processing days) in a period, shown beside the Almanac's tasks. */
export interface SharedDaysDto {
  from: string;
  to: string;
  days: { id: string; date: string; startTime: string; title: string; link: string }[];
}

/** Commons: what needs doing today and in the days to come. */
export interface AlmanacSummaryDto {
  farm: FarmRefDto;
  today: string;
  /** The last day of "this week": today + 6. */
  weekEnd: string;
  dueToday: AlmanacTaskDto[];
  thisWeek: AlmanacTaskDto[];
  overdue: AlmanacTaskDto[];
  attention: TaskAttention[];
  pendingReview: number;
}

export interface CycleSettingsDto {
  farmId: string;
  settings: CycleSettings;
  /** The farm has not changed any default. */
  isDefault: boolean;
  sources: Readonly<Record<keyof CycleSettings, CycleSettingSource>>;
  version: number;
  updatedAt: string | null;
}

export interface ReplanSummaryDto {
  changed: number;
  skipped: number;
  added: number;
}

export interface CycleSettingsSaveDto extends CycleSettingsDto {
  replanned: ReplanSummaryDto;
}

export type ServiceStatus = 'open' | 'kindled' | 'empty' | 'missed';

export interface PalpationDto {
  id: string;
  palpatedOn: string;
  result: 'positive' | 'negative' | 'unsure';
  notes: string;
  dayAfterService: number;
  recordedBy: PersonRefDto | null;
  /** An apprentice's palpation is unverified (pending) until her mentor accepts it; only then it counts. */
  reviewState: 'pending' | 'accepted';
}

export interface ServiceDto {
  id: string;
  farmId: string;
  doe: AnimalRefDto;
  buck: AnimalRefDto;
  servicedOn: string;
  status: ServiceStatus;
  closedOn: string | null;
  closeReason: string | null;
  notes: string;
  /** The warnings the breeder saw and confirmed when saving (young doe, under treatment). */
  warnings: BreedingCheck[];
  palpations: PalpationDto[];
  litterId: string | null;
  /** Where an unkindled service stands today (null once kindled or closed). */
  kindlingStatus: KindlingStatus | null;
  dayToday: number;
  tasks: AlmanacTaskDto[];
  recordedBy: PersonRefDto | null;
  version: number;
}

/** One page of the farm's services. */
export interface ServiceListDto {
  items: ServiceListItemDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ServiceListItemDto {
  id: string;
  doe: AnimalRefDto;
  buck: AnimalRefDto;
  servicedOn: string;
  status: ServiceStatus;
  closedOn: string | null;
  kindlingStatus: KindlingStatus | null;
  litterId: string | null;
  lastPalpation: 'positive' | 'negative' | null;
}

/** A doe or buck the farm can breed, with what the service form must warn about. */
export interface BreedingStockDto {
  id: string;
  name: string;
  tattoo: string | null;
  sex: Sex;
  birthDate: string | null;
  breedName: string | null;
  /** Her breed's earliest usual first-breeding age, days. */
  firstBreedingDays: number;
  /** On loan here from another farm (a buck). */
  onLoanFrom: FarmRefDto | null;
  openService: { id: string; servicedOn: string } | null;
  underTreatment: { treatment: string; endsOn: string } | null;
  /** The last kindling, for the breed-back date. */
  lastKindledOn: string | null;
}

export interface BreedingStockListDto {
  today: string;
  does: BreedingStockDto[];
  bucks: BreedingStockDto[];
}

/** TreatmentDto: see health/health-dto.ts. */

export interface LitterEventDto {
  id: string;
  kind: LitterEventKind;
  on: string;
  count: number;
  cause: string | null;
  /** Lost kits: why they died, from the shared list (null for other events). */
  deathCause: KitDeathCause | null;
  /** A weaning: the total live weight of the kits weaned, when weighed (grams). */
  weaningWeightGrams: number | null;
  /** For a fostering: the other litter, with its farm (the other litter's details are that farm's). */
  otherLitter: { id: string; farm: FarmRefDto; dam: AnimalRefDto | null; kindledOn: string | null; isOwnFarm: boolean } | null;
  enteredBy: PersonRefDto | null;
  /** Recorded by the other farm (kits fostered in from it). */
  fromOtherFarm: boolean;
  reviewState: ReviewState;
  reviewComment: string | null;
  version: number;
}

export interface LitterListItemDto {
  id: string;
  farmId: string;
  dam: AnimalRefDto;
  sire: AnimalRefDto;
  serviceId: string;
  kindledOn: string;
  ageDays: number;
  bornAlive: number;
  bornDead: number;
  onDoe: number;
  weaned: number;
  status: 'nursing' | 'weaned';
}

/** One page of the farm's litters, with how many there are in each state (for the filter's counts). */
export interface LitterListDto {
  items: LitterListItemDto[];
  total: number;
  page: number;
  pageSize: number;
  counts: { nursing: number; weaned: number; all: number };
}

export interface LitterDto extends LitterListItemDto {
  servicedOn: string;
  notes: string;
  summary: LitterSummary;
  /** Kits with the doe after each dated change, from the kindling on (for the picture). */
  countHistory: { on: string; count: number }[];
  events: LitterEventDto[];
  tasks: AlmanacTaskDto[];
  /** Kits kept with their own records: born here, or fostered in (then their own parents). */
  keepers: (AnimalRefDto & { bornInLitterId: string; birthDate: string | null })[];
  /** Litters that fostered kits into this one (a keeper may have been born there). */
  fosteredInFrom: { id: string; farm: FarmRefDto; dam: AnimalRefDto | null; kindledOn: string }[];
  housing: { unitId: string; unitName: string; placedOn: string } | null;
  /** Events of apprentices waiting for review. */
  pendingReview: number;
  version: number;
}

/** Another litter kits could be fostered to or from: nursing, kindled within a week of this one. */
export interface FosterCandidateDto {
  id: string;
  farm: FarmRefDto;
  isOwnFarm: boolean;
  dam: AnimalRefDto;
  kindledOn: string;
  /** Only for the farm's own litters: kits with the doe today. */
  onDoe: number | null;
}

export interface HousingPlacementDto {
  id: string;
  unitId: string;
  animal: AnimalRefDto | null;
  litter: { id: string; dam: AnimalRefDto; kindledOn: string } | null;
  placedOn: string;
  endedOn: string | null;
  note: string;
}

export interface HousingUnitDto {
  id: string;
  farmId: string;
  name: string;
  kind: HousingKind;
  capacity: number | null;
  notes: string;
  current: HousingPlacementDto[];
  version: number;
}

export interface CalendarFeedDto {
  active: boolean;
  createdAt: string | null;
  /** Only in the answer that creates or renews the feed: the secret address is never shown again. */
  url: string | null;
}

export interface DigestPreferenceDto {
  enabled: boolean;
  hour: number;
  timeZone: string;
}
