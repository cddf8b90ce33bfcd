import type { BreedingRecordFigures, KitDeathCause } from '../breeding/breeding-record';
import type { DoeCycleState } from '../breeding/doe-cycle';
import type { ServiceStatus } from './almanac-dto';

/** One doe on the board: who she is, where she stands, and the records her next job comes from. */
export interface DoeBoardItemDto {
  id: string;
  name: string;
  tattoo: string | null;
  hutch: string;
  birthDate: string | null;
  cycle: DoeCycleState;
  /** Her open service (for the palpation or kindling form), else null. */
  openServiceId: string | null;
  /** Her litter with kits still on her, else null. */
  nursingLitterId: string | null;
}

export interface DoeBoardDto {
  farm: { id: string; name: string };
  today: string;
  items: DoeBoardItemDto[];
  total: number;
  page: number;
  pageSize: number;
  /** Does in each state, over the whole farm (the board's summary line). */
  counts: Partial<Record<DoeCycleState['state'], number>>;
}

export interface BreedingRecordAnimalRef {
  id: string;
  name: string;
  tattoo: string | null;
}

export interface BreedingRecordServiceDto {
  id: string;
  servicedOn: string;
  buck: BreedingRecordAnimalRef | null;
  status: ServiceStatus;
  closedOn: string | null;
  palpation: { palpatedOn: string; result: 'positive' | 'negative' } | null;
  litterId: string | null;
}

export interface BreedingRecordLitterDto {
  id: string;
  serviceId: string;
  kindledOn: string;
  sire: BreedingRecordAnimalRef | null;
  bornAlive: number;
  bornDead: number;
  fosteredIn: number;
  fosteredOut: number;
  lost: number;
  culled: number;
  weaned: number;
  onDoe: number;
  weanedOn: string | null;
  weaningWeightGrams: number | null;
  /** Days from kindling to the previous kindling (null for her first litter). */
  daysSincePrevious: number | null;
  deaths: Partial<Record<KitDeathCause, number>>;
}

/** A doe's breeding record on her farm: every service and litter, newest first, with the figures. */
export interface BreedingRecordDto {
  doe: BreedingRecordAnimalRef;
  today: string;
  cycle: DoeCycleState;
  services: BreedingRecordServiceDto[];
  litters: BreedingRecordLitterDto[];
  figures: BreedingRecordFigures;
}
