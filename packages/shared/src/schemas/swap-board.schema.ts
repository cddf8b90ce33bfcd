import { z } from 'zod';
import type { FarmRefDto, PedigreeCardDto } from '../herd/herd-dto';
import { sexes, type Sex } from '../herd/herd-enums';
import { calendarDateSchema } from './animal.schema';
import { pageSchema, pageSizeSchema } from './application.schema';
import { MAX_TRANSFER_CENTS } from './ledger.schema';
import { multiLine, recordId, singleLine } from './text';

/**
 * Swap Board: members list breeding stock, a count of grow-out or what they want; others offer a
 * price, animals in trade, or both; an accepted offer moves the animals with their history in one
 * transaction. Money in integer cents, dates are calendar dates of the farms.
 */

export const swapListingKinds = ['breeding_stock', 'grow_out', 'wanted'] as const;
export type SwapListingKind = (typeof swapListingKinds)[number];

/** draft → open → under_offer → sold / withdrawn / expired. */
export const swapListingStates = ['draft', 'open', 'under_offer', 'sold', 'withdrawn', 'expired'] as const;
export type SwapListingState = (typeof swapListingStates)[number];
/** States in which the board shows a listing and it takes offers. */
export const swapLiveStates: readonly SwapListingState[] = ['open', 'under_offer'];

export const swapPriceModes = ['price', 'trade', 'offers'] as const;
export type SwapPriceMode = (typeof swapPriceModes)[number];

/** An offer: open (one side awaits the other's answer) → accepted → collected (or failed at hand-over); or declined, withdrawn, expired. */
export const swapOfferStates = ['open', 'accepted', 'collected', 'failed', 'declined', 'withdrawn', 'expired'] as const;
export type SwapOfferState = (typeof swapOfferStates)[number];

export const swapWantedAges = ['kit', 'junior', 'senior'] as const;
export type SwapWantedAge = (typeof swapWantedAges)[number];

/** The longest a listing stays up before it expires (common practice: a season). */
export const MAX_LISTING_DAYS = 120;

/**
 * Shown on every listing of animals that may end as meat (grow-out, fryers): selling meat and live
 * animals for meat follows state and local rules.
 */
export const SWAP_MEAT_CAUTION =
  'Selling rabbit meat, and live rabbits for meat, follows your state and local rules. Federal inspection of rabbit is voluntary in the US and state rules differ: check your own before you sell.';

const cents = z
  .number({ message: 'Enter the price' })
  .int('Give the price in whole cents')
  .min(0, 'The price cannot be negative')
  .max(MAX_TRANSFER_CENTS, 'That price is too large');

const tradeAnimals = z.array(recordId('An animal')).max(12, 'Offer at most 12 animals in trade');

export const swapListingSchema = z
  .strictObject({
    /** A client-chosen id: a retried create is one listing. */
    id: z.uuid().optional(),
    kind: z.enum(swapListingKinds, { error: 'Choose breeding stock, grow-out or a wanted post' }),
    title: singleLine('The title', 3, 120),
    /** The farm's notes for buyers (what travels with the listing, never the herd's private notes). */
    description: multiLine(2000).default(''),
    priceMode: z.enum(swapPriceModes, { error: 'Choose a price, trade or offers' }),
    priceCents: cents.nullable().default(null),
    collectPlace: singleLine('The place to collect', 0, 160).default(''),
    validUntil: calendarDateSchema,
    animalIds: z.array(recordId('An animal')).max(12, 'List at most 12 animals together').default([]),
    photoIds: z.array(recordId('A photo')).max(6, 'Pick at most 6 photos').default([]),
    shareWeights: z.boolean().default(true),
    groupId: recordId('The grow-out group').nullable().default(null),
    headCount: z.number().int('Count whole heads').min(1, 'List at least one head').max(500, 'List at most 500 heads').nullable().default(null),
    readyOn: calendarDateSchema.nullable().default(null),
    wantedBreedId: recordId('The breed').nullable().default(null),
    wantedSex: z.enum(sexes).nullable().default(null),
    wantedAge: z.enum(swapWantedAges).nullable().default(null),
    wantedBy: calendarDateSchema.nullable().default(null),
    /** Open it on the board at once; otherwise it stays a draft. */
    publish: z.boolean().default(true),
  })
  .superRefine((v, ctx) => {
    if (v.priceMode === 'price' && v.priceCents === null) ctx.addIssue({ code: 'custom', path: ['priceCents'], message: 'Enter the price, or choose trade or offers' });
    if (v.priceMode !== 'price' && v.priceCents !== null) ctx.addIssue({ code: 'custom', path: ['priceCents'], message: 'A price goes with "price" only' });
    if (v.kind === 'breeding_stock' && v.animalIds.length === 0) ctx.addIssue({ code: 'custom', path: ['animalIds'], message: 'Choose the animals you list' });
    if (v.kind !== 'breeding_stock' && v.animalIds.length > 0) ctx.addIssue({ code: 'custom', path: ['animalIds'], message: 'Only breeding stock lists animals of the herd' });
    if (v.kind === 'grow_out' && !v.groupId) ctx.addIssue({ code: 'custom', path: ['groupId'], message: 'Choose the grow-out group' });
    if (v.kind === 'grow_out' && !v.headCount) ctx.addIssue({ code: 'custom', path: ['headCount'], message: 'How many head do you list?' });
    if (new Set(v.animalIds).size !== v.animalIds.length) ctx.addIssue({ code: 'custom', path: ['animalIds'], message: 'Name each animal once' });
  });
export type SwapListingInput = z.infer<typeof swapListingSchema>;
export type SwapListingBody = z.input<typeof swapListingSchema>;

/**
 * PATCH /api/swap-board/listings/:listingId: the seller edits a draft or open listing (what it offers
 * stays: the animals, group and kind are listed anew). The version guards against a second editor.
 */
export const swapListingEditSchema = z
  .strictObject({
    version: z.number().int().min(0),
    title: singleLine('The title', 3, 120),
    description: multiLine(2000).default(''),
    priceMode: z.enum(swapPriceModes, { error: 'Choose a price, trade or offers' }),
    priceCents: cents.nullable().default(null),
    collectPlace: singleLine('The place to collect', 0, 160).default(''),
    validUntil: calendarDateSchema,
    photoIds: z.array(recordId('A photo')).max(6, 'Pick at most 6 photos').default([]),
  })
  .superRefine((v, ctx) => {
    if (v.priceMode === 'price' && v.priceCents === null) ctx.addIssue({ code: 'custom', path: ['priceCents'], message: 'Enter the price, or choose trade or offers' });
    if (v.priceMode !== 'price' && v.priceCents !== null) ctx.addIssue({ code: 'custom', path: ['priceCents'], message: 'A price goes with "price" only' });
    if (new Set(v.photoIds).size !== v.photoIds.length) ctx.addIssue({ code: 'custom', path: ['photoIds'], message: 'Pick each photo once' });
  });
export type SwapListingEditInput = z.infer<typeof swapListingEditSchema>;
export type SwapListingEditBody = z.input<typeof swapListingEditSchema>;

export const swapVersionSchema = z.strictObject({ version: z.number().int().min(0) });
export type SwapVersionInput = z.infer<typeof swapVersionSchema>;

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

/** GET /api/swap-board/listings: the board (open listings of the co-op) or the farm's own (`mine`). */
export const swapListingQuerySchema = z.strictObject({
  page: pageSchema,
  pageSize: pageSizeSchema,
  mine: booleanQuery.optional(),
  kind: z.enum(swapListingKinds).optional(),
  state: z.enum(swapListingStates).optional(),
  breedId: recordId('The breed').optional(),
  sex: z.enum(sexes).optional(),
  minPriceCents: z.coerce.number().int().min(0).max(MAX_TRANSFER_CENTS).optional(),
  maxPriceCents: z.coerce.number().int().min(0).max(MAX_TRANSFER_CENTS).optional(),
  /** Age of the (first) animal, in whole months. */
  minAgeMonths: z.coerce.number().int().min(0).max(240).optional(),
  maxAgeMonths: z.coerce.number().int().min(0).max(240).optional(),
  /** Share of known ancestors over three generations, 0–1. */
  minCompleteness: z.coerce.number().min(0).max(1).optional(),
  /** One of my animals: each listing shows the COI of a litter with it (the trial-mating computation). */
  mateWith: recordId('Your animal').optional(),
  maxCoi: z.coerce.number().min(0).max(1).optional(),
  search: z.string().trim().max(60).optional(),
  sort: z.enum(['newest', 'price', 'coi']).default('newest'),
});
export type SwapListingQuery = z.infer<typeof swapListingQuerySchema>;

export const swapOfferSchema = z
  .strictObject({
    /** A client-chosen id: the idempotency key of the offer (a retried offer is one offer). */
    id: z.uuid().optional(),
    listingId: recordId('The listing'),
    priceCents: cents.nullable().default(null),
    tradeAnimalIds: tradeAnimals.default([]),
    message: multiLine(1000).default(''),
    validUntil: calendarDateSchema,
  })
  .refine((v) => v.priceCents !== null || v.tradeAnimalIds.length > 0, { path: ['priceCents'], message: 'Offer a price, animals in trade, or both' });
export type SwapOfferInput = z.infer<typeof swapOfferSchema>;
export type SwapOfferBody = z.input<typeof swapOfferSchema>;

/** A counter-offer, by either side: new terms replace the standing ones and the other side answers. */
export const swapCounterSchema = z
  .strictObject({
    version: z.number().int().min(0),
    priceCents: cents.nullable().default(null),
    tradeAnimalIds: tradeAnimals.default([]),
    message: multiLine(1000).default(''),
    validUntil: calendarDateSchema,
  })
  .refine((v) => v.priceCents !== null || v.tradeAnimalIds.length > 0, { path: ['priceCents'], message: 'Offer a price, animals in trade, or both' });
export type SwapCounterInput = z.infer<typeof swapCounterSchema>;

/** Accepting: `key` is the idempotency key (the same key again answers the accepted offer). */
export const swapAcceptSchema = z.strictObject({
  version: z.number().int().min(0),
  key: z.uuid({ message: 'Send an idempotency key' }),
});
export type SwapAcceptInput = z.infer<typeof swapAcceptSchema>;

export const swapReasonSchema = z.strictObject({
  version: z.number().int().min(0),
  reason: multiLine(500).default(''),
});
export type SwapReasonInput = z.infer<typeof swapReasonSchema>;

export const swapOfferListQuerySchema = z.strictObject({
  page: pageSchema,
  pageSize: pageSizeSchema,
  /** `made`: my farm's offers on others' listings; `received`: offers on my farm's listings. */
  side: z.enum(['made', 'received']).default('made'),
  open: booleanQuery.optional(),
});
export type SwapOfferListQuery = z.infer<typeof swapOfferListQuerySchema>;

// ---------------------------------------------------------------------------------------------
// Answers
// ---------------------------------------------------------------------------------------------

export type SwapWeightBand = 'below' | 'within' | 'above' | 'growing' | 'no_standard';

/** An animal on a listing, as a buyer looks at it first. */
export interface SwapAnimalDto {
  card: PedigreeCardDto;
  ageDays: number | null;
  /** Share of known ancestors over three generations, 0–1. */
  completeness: number;
  /** The latest weight the seller publishes (when weights are shared), against the breed's senior band. */
  weight: { grams: number; weighedOn: string; band: SwapWeightBand } | null;
  /** COI of a litter with the animal of mine asked about (`mateWith`), else null. */
  trialCoi: number | null;
}

export interface SwapListingDto {
  id: string;
  kind: SwapListingKind;
  state: SwapListingState;
  farm: FarmRefDto;
  title: string;
  description: string;
  priceMode: SwapPriceMode;
  /** Null for who may not see money (apprentices), and for trade or offers. */
  priceCents: number | null;
  collectPlace: string;
  validUntil: string;
  animals: SwapAnimalDto[];
  photoIds: string[];
  grownOut: { groupId: string; groupName: string; crossLabel: string; headCount: number; readyOn: string | null } | null;
  wanted: { breedId: string | null; breedName: string | null; sex: Sex | null; age: SwapWantedAge | null; by: string | null } | null;
  /** The meat caution, on listings of animals that may end as meat. */
  caution: string | null;
  closedReason: string | null;
  openOffers: number;
  /** What the viewer may do: the seller's farm edits; other members offer. */
  mine: boolean;
  canOffer: boolean;
  version: number;
  createdAt: string;
}

export interface SwapListingListDto {
  items: SwapListingDto[];
  total: number;
  page: number;
  pageSize: number;
}

export interface SwapOfferEventDto {
  id: string;
  kind: 'offered' | 'countered' | 'accepted' | 'declined' | 'withdrawn' | 'expired' | 'collected' | 'failed';
  farm: FarmRefDto | null;
  actorName: string | null;
  priceCents: number | null;
  tradeAnimalIds: string[];
  text: string;
  at: string;
}

export interface SwapOfferDto {
  id: string;
  listingId: string;
  listingTitle: string;
  state: SwapOfferState;
  awaiting: 'seller' | 'buyer';
  seller: FarmRefDto;
  buyer: FarmRefDto;
  priceCents: number | null;
  tradeAnimals: PedigreeCardDto[];
  message: string;
  validUntil: string;
  acceptedOn: string | null;
  closedReason: string | null;
  events: SwapOfferEventDto[];
  /** The viewer's side, and what it may do now. */
  side: 'seller' | 'buyer';
  may: { accept: boolean; counter: boolean; decline: boolean; withdraw: boolean; confirmCollection: boolean; reportFailed: boolean };
  version: number;
}

export interface SwapOfferListDto {
  items: SwapOfferDto[];
  total: number;
  page: number;
  pageSize: number;
}

/** The listing page: the listing and the offer thread the viewer's farm is party to. */
export interface SwapListingPageDto {
  listing: SwapListingDto;
  offers: SwapOfferDto[];
}

/** The co-op hub's card: what is on the board and what waits for me. */
export interface SwapBoardSummaryDto {
  openListings: number;
  wantedPosts: number;
  myOpenListings: number;
  offersAwaitingMe: number;
}
