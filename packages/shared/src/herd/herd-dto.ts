import type { DoeCycleState } from '../breeding/doe-cycle';
import type { AgeClass } from './age-class';
import type { WeightAgainstStandard, WeightRange } from './breed-standard';
import type {
  BodyType, Confidence, CustodyEventKind, CustodyStatus, Disposition, Lifecycle, Purity, ReviewState, Sex, SizeClass,
} from './herd-enums';

export interface SourcedValue {
  source: string;
  confidence: Confidence;
}

export interface BreedDto {
  id: string;
  name: string;
  /** Catalogue breeds come with the app; the others were added by this co-op's admin. */
  isCatalogue: boolean;
  seniorBuckGrams: WeightRange;
  seniorDoeGrams: WeightRange;
  idealWeightGrams: number | null;
  showClassCount: 4 | 6;
  bodyType: BodyType | null;
  sizeClass: SizeClass;
  firstBreedingDays: { doe: { min: number; max: number }; buck: { min: number; max: number } };
  slowGrowing: boolean;
  heavyBoned: boolean;
  meatNotes: string;
  /** Where each value comes from, e.g. `sources.buckWeight = { source, confidence: 'sec' }`. */
  sources: Record<string, SourcedValue | null>;
}

export interface BreedShareDto {
  breedId: string;
  name: string;
  /** 0–1; the shares and `unknown` add up to 1. */
  fraction: number;
}

export interface BreedMakeupDto {
  breeds: BreedShareDto[];
  unknown: number;
  purity: Purity;
}

export interface FarmRefDto {
  id: string;
  name: string;
}

/**
 * What every member of the co-op may see of any animal (brief, "the pedigree card"): never weights,
 * notes, health, photos or money.
 */
export interface PedigreeCardDto {
  id: string;
  isOutside: boolean;
  name: string;
  tattoo: string | null;
  sex: Sex;
  birthDate: string | null;
  colour: string;
  registrationNumber: string | null;
  breedMakeup: BreedMakeupDto;
  breedingFarm: FarmRefDto | null;
  /** For animals bred outside the co-op (from the papers). */
  breederName: string;
  /** The farm that keeps it now; null for outside animals and animals that left. */
  currentFarm: FarmRefDto | null;
  /** Still alive and on a co-op farm (a buck one could use). */
  onFarm: boolean;
  /** Coefficient of inbreeding, 0–1, computed over the whole co-op's pedigree. */
  coi: number;
  sireId: string | null;
  damId: string | null;
}

export interface LatestWeightDto {
  grams: number;
  weighedOn: string;
  reviewState: ReviewState;
}

/** The full record, for the farm that owns or keeps the animal (and that farm's apprentices). */
export interface AnimalDto extends PedigreeCardDto {
  owningFarm: FarmRefDto | null;
  keepingFarm: FarmRefDto | null;
  custody: CustodyStatus;
  /** The declared breed (used for make-up only when no parent is recorded). */
  breedId: string | null;
  breedName: string | null;
  hutch: string;
  notes: string;
  lifecycle: Lifecycle;
  disposition: Disposition;
  dispositionCause: string | null;
  ageClass: AgeClass | null;
  ageDays: number | null;
  latestWeight: LatestWeightDto | null;
  /** The latest accepted weight of a senior against its breed's senior range. */
  weightAgainstStandard: WeightAgainstStandard | null;
  version: number;
  createdAt: string;
  updatedAt: string;
}

/**
 * One row of the herd list: what the herd table and its phone cards show (and what the forms that pick
 * an animal read), nothing more. The full record is the animal's own page.
 */
export type AnimalListItemDto = Pick<
  AnimalDto,
  'id' | 'tattoo' | 'name' | 'sex' | 'birthDate' | 'breedMakeup' | 'coi' | 'ageClass' | 'lifecycle' | 'disposition' | 'hutch' | 'custody' | 'latestWeight'
> & {
  /** A doe the farm keeps: where she stands in her cycle (as on the doe board); null for others. */
  cycle: DoeCycleState | null;
};

export interface AnimalListDto {
  items: AnimalListItemDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface StatusEventDto {
  id: string;
  kind: 'lifecycle' | 'disposition';
  value: Lifecycle | Disposition;
  cause: string | null;
  effectiveOn: string;
  farm: FarmRefDto | null;
  recordedBy: { id: string; name: string } | null;
}

export interface CustodyEventDto {
  id: string;
  kind: CustodyEventKind;
  fromFarm: FarmRefDto | null;
  toFarm: FarmRefDto | null;
  owningFarm: FarmRefDto | null;
  keepingFarm: FarmRefDto | null;
  movedOn: string;
  tattooBefore: string | null;
  tattooAfter: string | null;
  note: string;
}

export interface WeighInDto {
  id: string;
  farmId: string;
  animalId: string | null;
  groupLabel: string | null;
  totalGrams: number;
  headCount: number;
  /** Total over head count, rounded to the gram. */
  gramsPerHead: number;
  weighedOn: string;
  note: string;
  enteredBy: { id: string; name: string };
  reviewState: ReviewState;
  reviewComment: string | null;
  version: number;
}

export interface AnimalNoteDto {
  id: string;
  animalId: string;
  body: string;
  notedOn: string;
  enteredBy: { id: string; name: string };
  reviewState: ReviewState;
  reviewComment: string | null;
  version: number;
}

export interface AnimalDetailDto extends AnimalDto {
  breed: BreedDto | null;
  statusHistory: StatusEventDto[];
  custodyHistory: CustodyEventDto[];
  offspring: PedigreeCardDto[];
  sire: PedigreeCardDto | null;
  dam: PedigreeCardDto | null;
  /** Fraction of known ancestors per generation: [parents, grandparents, great-, great-great-]. */
  completeness: number[];
  noteLog: AnimalNoteDto[];
}

/**
 * A pedigree picture: `slots` in heap order (1 = the animal, 2k = sire of k, 2k + 1 = dam of k;
 * slot 0 unused), each an animal id or null when unknown; `cards` holds each animal once.
 */
export interface PedigreeTreeDto {
  rootId: string;
  generations: number;
  slots: (string | null)[];
  cards: Record<string, PedigreeCardDto>;
  completeness: number[];
}

export interface PedigreeCardListDto {
  items: PedigreeCardDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface TrialLitterDto {
  sire: PedigreeCardDto;
  /** F of the litter = kinship of the two parents. */
  coi: number;
  breedMakeup: BreedMakeupDto;
  /** Ancestors found on both sides within five generations, nearest first. */
  commonAncestors: { id: string; name: string; tattoo: string | null }[];
  /** How the buck is related to the doe, in words: "her sire", "half-brother", "no shared ancestor on record". */
  relationship: string;
}

export interface TrialMatingDto {
  dam: PedigreeCardDto;
  litters: TrialLitterDto[];
}

/** An outside animal as the registry returns it; `matched` says whether an existing record was found. */
export interface OutsideAnimalResultDto {
  animal: PedigreeCardDto;
  matched: boolean;
}
