import { z } from 'zod';
import { calendarDateSchema } from './animal.schema';
import { pageSchema, pageSizeSchema } from './application.schema';
import { singleLine, recordId } from './text';


/** A purchase of feed in whole bags; the bag weight is entered in the farm's units and sent in grams. */
export const feedPurchaseCreateSchema = z.strictObject({
  id: recordId('The purchase').optional(),
  boughtOn: calendarDateSchema,
  productName: singleLine('The feed', 1, 80),
  bagGrams: z.number({ message: 'Enter the bag weight' }).int('Weights are whole grams').min(100, 'A bag under 100 g is not a feed bag').max(100_000, 'A bag over 100 kg; check the weight'),
  bags: z.number({ message: 'Enter how many bags' }).int('Whole bags').min(1, 'At least one bag').max(1000, 'More than 1,000 bags; check the count'),
  priceCents: z.number({ message: 'Enter what was paid' }).int('Whole cents').min(0, 'A price cannot be negative').max(100_000_000, 'That price looks wrong; check it'),
  crudeProteinPercent: z.number().min(0, 'Protein cannot be negative').max(60, 'No rabbit feed is over 60 % protein').nullable().optional(),
  note: z.string().trim().max(500).default(''),
});
export type FeedPurchaseCreateInput = z.infer<typeof feedPurchaseCreateSchema>;
export type FeedPurchaseCreateBody = z.input<typeof feedPurchaseCreateSchema>;

const version = z.number({ message: 'Send the version you saw' }).int().min(0);

/** A purchase corrected in place (a mistyped weight, date or price), from the version the editor saw. */
export const feedPurchaseUpdateSchema = feedPurchaseCreateSchema.omit({ id: true }).extend({ version });
export type FeedPurchaseUpdateInput = z.infer<typeof feedPurchaseUpdateSchema>;
export type FeedPurchaseUpdateBody = z.input<typeof feedPurchaseUpdateSchema>;

/** A purchase or an entry of feed given taken out of the book, from the version seen (`?version=`). */
export const feedEntryRemovalSchema = z.strictObject({ version: z.coerce.number({ message: 'Send the version you saw' }).int().min(0) });

export const feedTargets = ['group', 'pen', 'doe', 'farm'] as const;
export type FeedTarget = (typeof feedTargets)[number];
export const feedAllocationRules = ['head_days', 'live_weight'] as const;
export type FeedAllocationRule = (typeof feedAllocationRules)[number];

/**
 * Feed given: grams from a purchase (or the oldest stock of the feed: first bought, first used) to a
 * grow-out group, a pen, a doe with her litter, or the whole farm. Feed to a pen or the whole farm is
 * split over the groups and does with litters there by head-days or by live weight; `fromOn` starts the
 * period the feed covers (default: the day given).
 */
const feedUseFields = z.strictObject({
    id: recordId('The entry').optional(),
    givenOn: calendarDateSchema,
    fromOn: calendarDateSchema.optional(),
    grams: z.number({ message: 'Enter the amount' }).int('Weights are whole grams').min(1, 'Enter an amount above zero').max(10_000_000, 'More than 10 tonnes; check the amount'),
    purchaseId: recordId('The purchase').nullable().optional(),
    productName: singleLine('The feed', 1, 80).optional(),
    target: z.enum(feedTargets, { message: 'Choose who the feed went to' }),
    groupId: recordId('The group').optional(),
    housingUnitId: recordId('The pen').optional(),
    doeId: recordId('The doe').optional(),
    allocation: z.enum(feedAllocationRules, { message: 'Choose how to split the feed' }).optional(),
    note: z.string().trim().max(500).default(''),
  });

type FeedUseFields = z.infer<typeof feedUseFields>;

function checkFeedUse(v: Omit<FeedUseFields, 'id'>, ctx: z.RefinementCtx): void {
    if (!v.purchaseId && !v.productName) ctx.addIssue({ code: 'custom', path: ['purchaseId'], message: 'Choose the purchase or the feed' });
    if (v.target === 'group' && !v.groupId) ctx.addIssue({ code: 'custom', path: ['groupId'], message: 'Choose the group' });
    if (v.target === 'pen' && !v.housingUnitId) ctx.addIssue({ code: 'custom', path: ['housingUnitId'], message: 'Choose the pen' });
    if (v.target === 'doe' && !v.doeId) ctx.addIssue({ code: 'custom', path: ['doeId'], message: 'Choose the doe' });
    if ((v.target === 'pen' || v.target === 'farm') && !v.allocation) ctx.addIssue({ code: 'custom', path: ['allocation'], message: 'Choose how to split the feed: by head-days or by live weight' });
    if (v.fromOn && v.fromOn > v.givenOn) ctx.addIssue({ code: 'custom', path: ['fromOn'], message: 'The period starts after the day the feed was given' });
}

export const feedUseCreateSchema = feedUseFields.superRefine(checkFeedUse);
export type FeedUseCreateInput = z.infer<typeof feedUseCreateSchema>;
export type FeedUseCreateBody = z.input<typeof feedUseCreateSchema>;

/** An entry of feed given corrected: the whole entry again, from the version seen; its split is worked anew. */
export const feedUseUpdateSchema = feedUseFields.omit({ id: true }).extend({ version }).superRefine(checkFeedUse);
export type FeedUseUpdateInput = z.infer<typeof feedUseUpdateSchema>;
export type FeedUseUpdateBody = z.input<typeof feedUseUpdateSchema>;

/** GET /api/feed: the feed book with one page of the feed given, latest first (years of entries are thousands). */
export const feedBookQuerySchema = z.strictObject({
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type FeedBookQuery = z.infer<typeof feedBookQuerySchema>;
