import { z } from 'zod';
import type { BreedMakeupDto, FarmRefDto, PedigreeCardDto } from '../herd/herd-dto';
import { calendarDateSchema } from './animal.schema';
import { MAX_TRANSFER_CENTS } from './ledger.schema';
import { multiLine, recordId, singleLine } from './text';

/**
 * Stud Share: a farm offers one of its bucks to the co-op (a loan: he travels to the borrower; a stud
 * service: the doe visits him), a member finds the right buck for her doe and requests him, and the
 * loan runs from hand-over to return. Money in integer cents, dates are calendar dates of the farms.
 */

export const studKinds = ['loan', 'service'] as const;
export type StudKind = (typeof studKinds)[number];

/**
 * A request's state. `dates_proposed`: the owner offered other dates and waits for the requester.
 * A loan goes accepted → handed_over → returned; a service visit goes accepted → served.
 */
export const studLoanStates = ['requested', 'dates_proposed', 'accepted', 'declined', 'cancelled', 'handed_over', 'returned', 'served'] as const;
export type StudLoanState = (typeof studLoanStates)[number];
/** States in which the buck's dates are held (what the database refuses to overlap). */
export const studHoldingStates: readonly StudLoanState[] = ['accepted', 'handed_over'];

export const studEventKinds = [
  'requested', 'accepted', 'declined', 'dates_proposed', 'proposal_accepted', 'proposal_declined', 'cancelled',
  'hand_over_recorded', 'hand_over_confirmed', 'return_recorded', 'return_confirmed', 'served', 'overdue',
] as const;
export type StudEventKind = (typeof studEventKinds)[number];

/** The longest loan an offer may allow: a breeding season (common practice). */
export const MAX_LOAN_DAYS = 180;
/** How far ahead a request may reach. */
export const MAX_REQUEST_DAYS_AHEAD = 400;

const feeCents = z
  .number({ message: 'Enter the fee' })
  .int('Give the fee in whole cents')
  .min(0, 'The fee cannot be negative')
  .max(MAX_TRANSFER_CENTS, 'That fee is too large')
  .nullable();

const grams = z.number().int('Give the weight in whole grams').min(200, 'A buck weighs more than that').max(20_000, 'That weight is too large for a rabbit');

export const studOfferSchema = z
  .strictObject({
    buckId: recordId('The buck'),
    loan: z.boolean(),
    service: z.boolean(),
    /** Per loan; null or 0: no fee. */
    loanFeeCents: feeCents.default(null),
    /** Per recorded service (a visit, or each service during a loan when the loan fee is null). */
    serviceFeeCents: feeCents.default(null),
    longestLoanDays: z.number().int().min(1, 'A loan lasts at least a day').max(MAX_LOAN_DAYS, `Keep loans to ${MAX_LOAN_DAYS} days at most`).default(42),
    /** Days he rests at home between two loans. */
    restDays: z.number().int().min(0).max(120, 'Keep the rest under 120 days').default(7),
    terms: multiLine(2000).default(''),
    /** Where he may travel, in her words ("within Harlan County"). */
    travelArea: singleLine('The travel area', 0, 120).default(''),
    lastHealthCheckOn: calendarDateSchema.nullable().default(null),
    rhdv2VaccinatedOn: calendarDateSchema.nullable().default(null),
    knownConditions: multiLine(1000).default(''),
    /** Photos of him (through the photo pipeline) the owner shows on his card. */
    photoIds: z.array(recordId('A photo')).max(6, 'Pick at most 6 photos').default([]),
    /** Show his weights on the card. */
    shareWeights: z.boolean().default(true),
  })
  .refine((v) => v.loan || v.service, { path: ['loan'], message: 'Offer him on loan, for stud service, or both' });
export type StudOfferInput = z.infer<typeof studOfferSchema>;
export type StudOfferBody = z.input<typeof studOfferSchema>;

/** An edit of an offer carries its version (two members of the farm may edit it). */
export const studOfferUpdateSchema = z.strictObject({
  version: z.number().int().min(0),
  offer: studOfferSchema,
});
export type StudOfferUpdateInput = z.infer<typeof studOfferUpdateSchema>;

export const studOfferListQuerySchema = z.strictObject({
  /** `mine`: the offers of the asking person's farms (withdrawn ones too). */
  scope: z.enum(['coop', 'mine']).default('coop'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type StudOfferListQuery = z.infer<typeof studOfferListQuerySchema>;

/** Availability calendar of a buck over a period (at most a year). */
export const studAvailabilityQuerySchema = z
  .strictObject({ from: calendarDateSchema, to: calendarDateSchema })
  .refine((v) => v.from <= v.to, { path: ['to'], message: 'The period ends before it starts' });
export type StudAvailabilityQuery = z.infer<typeof studAvailabilityQuerySchema>;

export const studFinderSorts = ['rank', 'coi', 'fee', 'distance', 'growth'] as const;
export type StudFinderSort = (typeof studFinderSorts)[number];

const booleanFlag = z.enum(['true', 'false']).transform((v) => v === 'true');

/** The finder from one doe: every offered buck of the co-op, ranked. */
export const studFinderQuerySchema = z
  .strictObject({
    damId: recordId('The doe'),
    kind: z.enum(studKinds).optional(),
    /** Breed id: bucks with some of this breed. */
    breedId: z.uuid().optional(),
    from: calendarDateSchema.optional(),
    to: calendarDateSchema.optional(),
    /** Only bucks free over from–to. */
    freeOnly: booleanFlag.optional(),
    maxFeeCents: z.coerce.number().int().min(0).max(MAX_TRANSFER_CENTS).optional(),
    maxDistanceKm: z.coerce.number().min(0).max(20_000).optional(),
    sort: z.enum(studFinderSorts).default('rank'),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  })
  .refine((v) => !v.from || !v.to || v.from <= v.to, { path: ['to'], message: 'The period ends before it starts' });
export type StudFinderQuery = z.infer<typeof studFinderQuerySchema>;

export const studRequestSchema = z
  .strictObject({
    /** Client-chosen id, so a retried request never makes two. */
    id: z.uuid().optional(),
    offerId: recordId('The offer'),
    kind: z.enum(studKinds, { message: 'Choose a loan or a stud service' }),
    /** The doe(s) it is for, of the requesting farm. */
    doeIds: z.array(recordId('A doe')).min(1, 'Choose the doe it is for').max(12, 'At most 12 does per request'),
    /** The farm asking (a member of several farms says which). */
    farmId: recordId('Your farm'),
    /** A loan: first and last day with the borrower; a service: the visit date in both. */
    startOn: calendarDateSchema,
    endOn: calendarDateSchema,
    message: multiLine(1000).default(''),
  })
  .refine((v) => v.startOn <= v.endOn, { path: ['endOn'], message: 'The loan ends before it starts' })
  .refine((v) => v.kind === 'loan' || v.startOn === v.endOn, { path: ['endOn'], message: 'A stud service is one visit day' });
export type StudRequestInput = z.infer<typeof studRequestSchema>;

export const studDeclineSchema = z.strictObject({
  version: z.number().int().min(0),
  reason: singleLine('The reason', 3, 500),
});
export const studProposeSchema = z
  .strictObject({
    version: z.number().int().min(0),
    startOn: calendarDateSchema,
    endOn: calendarDateSchema,
    message: multiLine(1000).default(''),
  })
  .refine((v) => v.startOn <= v.endOn, { path: ['endOn'], message: 'The loan ends before it starts' });
export type StudProposeInput = z.infer<typeof studProposeSchema>;
/** Accept, cancel, accept or decline a proposal: only the version seen. */
export const studVersionSchema = z.strictObject({
  version: z.number().int().min(0),
  reason: multiLine(500).default(''),
});
export type StudVersionInput = z.infer<typeof studVersionSchema>;
export const studProposalAnswerSchema = z.strictObject({
  version: z.number().int().min(0),
  accept: z.boolean(),
  reason: multiLine(500).default(''),
});
export type StudProposalAnswerInput = z.infer<typeof studProposalAnswerSchema>;

/** A hand-over or a return, recorded by one farm (confirmed by the other with an empty body). */
export const studCustodyStepSchema = z.strictObject({
  version: z.number().int().min(0),
  on: calendarDateSchema,
  weightGrams: grams.nullable().default(null),
  conditionNotes: multiLine(1000).default(''),
  photoId: recordId('The photo').nullable().default(null),
});
export type StudCustodyStepInput = z.infer<typeof studCustodyStepSchema>;

export const studLoanListQuerySchema = z.strictObject({
  /** `requests`: what my farms asked for; `offers`: what was asked of my farms' bucks. */
  side: z.enum(['requests', 'offers']).default('requests'),
  state: z.enum(studLoanStates).optional(),
  /** Open ones only (requested, proposed, accepted, handed over). */
  open: booleanFlag.optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type StudLoanListQuery = z.infer<typeof studLoanListQuerySchema>;

/** Optional farm coordinates (WGS84 degrees), for distances between farms; both or neither. */
export const farmCoordinatesSchema = z
  .strictObject({
    latitude: z.number().min(-90, 'Latitude is between -90 and 90').max(90, 'Latitude is between -90 and 90').nullable(),
    longitude: z.number().min(-180, 'Longitude is between -180 and 180').max(180, 'Longitude is between -180 and 180').nullable(),
    /** Let the co-op count this farm's litters in sires' get's records (on unless changed). */
    sharesGetRecords: z.boolean().optional(),
  })
  .refine((v) => (v.latitude === null) === (v.longitude === null), { path: ['longitude'], message: 'Give both latitude and longitude, or neither' });
export type FarmCoordinatesInput = z.infer<typeof farmCoordinatesSchema>;

// ---------------------------------------------------------------------------------------------- DTOs

export interface StudHealthDto {
  lastHealthCheckOn: string | null;
  rhdv2VaccinatedOn: string | null;
  knownConditions: string;
  /** Sired at least one recorded litter (from the records, never typed). */
  proven: boolean;
  littersSired: number;
}

/** His get's record, from litters the farms allow the co-op to see. Null figures: not enough records. */
export interface GetRecordDto {
  littersSired: number;
  meanBornAlive: number | null;
  meanWeaned: number | null;
  /** Mean daily gain of his get, grams per day. */
  meanDailyGainGrams: number | null;
  /** Mean age at the farm's target weight, days. */
  meanDaysToTarget: number | null;
  /** Mean dress-out, 0–1. */
  meanDressOut: number | null;
}

export interface StudWeightDto {
  grams: number;
  weighedOn: string;
}

export interface StudPhotoDto {
  id: string;
  url: string;
}

/** A buck card: his pedigree card plus what the offer shares. `fee*` are null for apprentices. */
export interface BuckCardDto {
  offerId: string;
  version: number;
  status: 'offered' | 'withdrawn';
  buck: PedigreeCardDto;
  owningFarm: FarmRefDto;
  loan: boolean;
  service: boolean;
  loanFeeCents: number | null;
  serviceFeeCents: number | null;
  /** False where fees are hidden (an apprentice): the fee fields are then null, not "free". */
  feesVisible: boolean;
  longestLoanDays: number;
  restDays: number;
  terms: string;
  travelArea: string;
  health: StudHealthDto;
  weights: StudWeightDto[];
  getRecord: GetRecordDto;
  photos: StudPhotoDto[];
  /** On loan now (the borrowing farm), when he is away. */
  onLoanTo: FarmRefDto | null;
  canEdit: boolean;
  canRequest: boolean;
  createdAt: string;
  updatedAt: string;
}

export interface BuckCardListDto {
  items: BuckCardDto[];
  total: number;
  page: number;
  pageSize: number;
}

export type StudBlockReason = 'loan' | 'own_service' | 'rest';
export interface StudBlockDto {
  startOn: string;
  endOn: string;
  reason: StudBlockReason;
  /** The loan holding the dates (not for the owner's own services). */
  loanId: string | null;
}
export interface StudAvailabilityDto {
  buckId: string;
  from: string;
  to: string;
  /** Dates he is not free, merged per reason. */
  blocked: StudBlockDto[];
}

/** Breed make-up class of the litter. */
export type LitterMakeupClass = 'purebred' | 'known_cross' | 'partly_unknown';

export interface SharedAncestorDto {
  id: string;
  name: string;
  tattoo: string | null;
}

/** One row of the finder: a buck with the litter he would sire with the doe. */
export interface StudFinderRowDto {
  rank: number;
  card: BuckCardDto;
  /** Coefficient of inbreeding of the litter, 0–1, over the co-op's whole pedigree. */
  litterCoi: number;
  litterMakeup: BreedMakeupDto;
  makeupClass: LitterMakeupClass;
  sharedAncestors: SharedAncestorDto[];
  getRecord: GetRecordDto;
  /** Free over the asked dates; null when no dates were given. */
  available: boolean | null;
  /** Fee of the asked kind (loan when not given and offered); null for apprentices or no fee. */
  feeCents: number | null;
  /** Great-circle distance between the two farms, km; null unless both farms have coordinates. */
  distanceKm: number | null;
  /** One line naming why he stands where he does. */
  explanation: string;
}

export interface StudFinderDto {
  dam: PedigreeCardDto;
  /** How the list is ordered, in one line. */
  order: string;
  items: StudFinderRowDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface StudCustodyStepDto {
  on: string;
  weightGrams: number | null;
  conditionNotes: string;
  photo: StudPhotoDto | null;
  recordedByFarmId: string;
  recordedBy: { id: string; name: string };
  recordedAt: string;
  confirmedBy: { id: string; name: string } | null;
  confirmedAt: string | null;
}

export interface StudLoanEventDto {
  id: string;
  kind: StudEventKind;
  at: string;
  by: { id: string; name: string } | null;
  farm: FarmRefDto | null;
  /** Plain one line: "Proposed 3–17 March instead", "Declined: he is resting". */
  text: string;
}

/** A request, loan or service visit, as both farms see it (`feeCents` null for apprentices). */
export interface StudLoanDto {
  id: string;
  version: number;
  kind: StudKind;
  state: StudLoanState;
  offerId: string;
  buck: PedigreeCardDto;
  owningFarm: FarmRefDto;
  requestingFarm: FarmRefDto;
  does: PedigreeCardDto[];
  startOn: string;
  endOn: string;
  /** The owner's proposed dates while `dates_proposed`. */
  proposedStartOn: string | null;
  proposedEndOn: string | null;
  message: string;
  declineReason: string | null;
  feeCents: number | null;
  feesVisible: boolean;
  handOver: StudCustodyStepDto | null;
  return: StudCustodyStepDto | null;
  /** Past its last day and not back (loans). */
  overdue: boolean;
  /** The co-op's quarantine window in days, placed on the receiving farm's Almanac. */
  quarantineDays: number;
  timeline: StudLoanEventDto[];
  /** What the asking person may do now. */
  actions: StudLoanAction[];
  createdAt: string;
}

export type StudLoanAction =
  | 'accept' | 'decline' | 'propose' | 'answer_proposal' | 'cancel'
  | 'record_hand_over' | 'confirm_hand_over' | 'record_return' | 'confirm_return' | 'record_service';

export interface StudLoanListDto {
  items: StudLoanDto[];
  total: number;
  page: number;
  pageSize: number;
}
