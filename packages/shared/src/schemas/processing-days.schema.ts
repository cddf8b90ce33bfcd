import { z } from 'zod';
import { calendarDateSchema } from './animal.schema';
import { MAX_TRANSFER_CENTS } from './ledger.schema';
import { multiLine, recordId, singleLine } from './text';

/**
 * Inputs of Processing Days: the co-op's sites, a scheduled day with its stations, equipment and expected
 * shared costs, bookings of head, roster sign-ups, check-in, yields and the closing of the day. Money is in
 * integer cents; head are whole animals. What the schema cannot know (capacity left, the deadline in the host
 * farm's time zone, a withdrawal on the day) the server checks.
 */

export const bookingStatuses = ['booked', 'waitlisted', 'offered', 'cancelled'] as const;
export type BookingStatus = (typeof bookingStatuses)[number];

export const processingDayStatuses = ['scheduled', 'closed', 'cancelled'] as const;
export type ProcessingDayStatus = (typeof processingDayStatuses)[number];

export const waterSupplies = ['potable_mains', 'potable_well', 'carried_in', 'none'] as const;
export type WaterSupply = (typeof waterSupplies)[number];

/** The largest day the schema takes; a site's own capacity is the real limit. */
export const MAX_DAY_HEAD = 2000;

const wholeHead = (what: string, min: number, max = MAX_DAY_HEAD) =>
  z
    .number({ message: `Enter the ${what}` })
    .int(`Give the ${what} in whole head`)
    .min(min, min === 0 ? `The ${what} cannot be below zero` : `The ${what} must be at least ${min}`)
    .max(max, `The ${what} must be at most ${max.toLocaleString('en-US')}`);

const cents = (what: string) =>
  z
    .number({ message: `Enter the ${what}` })
    .int(`Give the ${what} in whole cents`)
    .min(0, `The ${what} cannot be below zero`)
    .max(MAX_TRANSFER_CENTS, `The ${what} is too large`);

const version = z.number({ message: 'Send the version you saw' }).int().min(0);

/** 24-hour clock, local to the host farm. */
export const startTimeSchema = z.string({ message: 'Enter the start time' }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Enter the start time as HH:MM');

// ---- sites (co-op settings) ----

export const processingSiteCreateSchema = z.strictObject({
  name: singleLine('The site name', 2, 80),
  /** The member farm that hosts the site. */
  hostFarmId: recordId('The host farm'),
  address: multiLine(300).pipe(z.string().min(5, 'Enter the address')),
  capacityHeadPerDay: wholeHead('capacity a day', 1),
  /** Carcasses the chill tanks and cooler hold at once. */
  chillCapacityHead: wholeHead('chill capacity', 0),
  water: z.enum(waterSupplies, { message: 'Choose the water supply' }),
  /** The admin lets the host farm's members schedule days here. */
  hostMaySchedule: z.boolean().default(false),
  notes: multiLine(1000).default(''),
});
export type ProcessingSiteCreateInput = z.infer<typeof processingSiteCreateSchema>;
export type ProcessingSiteCreateBody = z.input<typeof processingSiteCreateSchema>;

export const processingSiteUpdateSchema = processingSiteCreateSchema.partial().extend({ version });
export type ProcessingSiteUpdateInput = z.infer<typeof processingSiteUpdateSchema>;

// ---- a day ----

export const stationInputSchema = z.strictObject({
  /** Kept when renaming so sign-ups stay. */
  id: recordId('The station').optional(),
  name: singleLine('The station name', 2, 60),
  places: z.number({ message: 'Enter the places' }).int('Whole places').min(1, 'At least one place').max(30, 'At most 30 places'),
});
export type StationInput = z.infer<typeof stationInputSchema>;

export const equipmentInputSchema = z.strictObject({
  id: recordId('The equipment').optional(),
  name: singleLine('The equipment', 2, 80),
});

export const costLineSchema = z.strictObject({
  label: singleLine('The cost', 2, 80),
  amountCents: cents('amount'),
});
export type CostLine = z.infer<typeof costLineSchema>;

/** The usual stations; the co-op renames and adds. Places are common practice for a day of about 60 head. */
export const DEFAULT_STATIONS: ReadonlyArray<{ name: string; places: number }> = [
  { name: 'Dispatch', places: 2 },
  { name: 'Skinning', places: 3 },
  { name: 'Evisceration', places: 3 },
  { name: 'Chilling', places: 1 },
  { name: 'Packing', places: 2 },
  { name: 'Clean-up', places: 2 },
];

const dayFields = {
  siteId: recordId('The site'),
  date: calendarDateSchema,
  startTime: startTimeSchema,
  capacityHead: wholeHead('capacity', 1),
  /** The last day to book, change or cancel; closes at the end of that day in the host farm's time zone. */
  signUpDeadline: calendarDateSchema,
  feePerHeadCents: cents('fee per head'),
  expectedCosts: z.array(costLineSchema).max(20, 'At most 20 cost lines').default([]),
  stations: z
    .array(stationInputSchema)
    .min(1, 'Add at least one station')
    .max(20, 'At most 20 stations')
    .default(() => DEFAULT_STATIONS.map((s) => ({ ...s }))),
  equipment: z.array(equipmentInputSchema).max(60, 'At most 60 items').default([]),
  notes: multiLine(2000).default(''),
};

export const processingDayCreateSchema = z
  .strictObject({ id: recordId('The day').optional(), ...dayFields })
  .refine((v) => v.signUpDeadline <= v.date, { path: ['signUpDeadline'], message: 'The sign-up deadline must be on or before the day' });
export type ProcessingDayCreateInput = z.infer<typeof processingDayCreateSchema>;
export type ProcessingDayCreateBody = z.input<typeof processingDayCreateSchema>;

export const processingDayUpdateSchema = z
  .strictObject({
    version,
    date: dayFields.date.optional(),
    startTime: dayFields.startTime.optional(),
    capacityHead: dayFields.capacityHead.optional(),
    signUpDeadline: dayFields.signUpDeadline.optional(),
    feePerHeadCents: dayFields.feePerHeadCents.optional(),
    expectedCosts: z.array(costLineSchema).max(20).optional(),
    stations: z.array(stationInputSchema).min(1, 'Add at least one station').max(20).optional(),
    equipment: z.array(equipmentInputSchema).max(60).optional(),
    notes: multiLine(2000).optional(),
  })
  .refine((v) => !v.signUpDeadline || !v.date || v.signUpDeadline <= v.date, { path: ['signUpDeadline'], message: 'The sign-up deadline must be on or before the day' });
export type ProcessingDayUpdateInput = z.infer<typeof processingDayUpdateSchema>;

export const processingDayListQuerySchema = z.strictObject({
  when: z.enum(['upcoming', 'past', 'all']).default('upcoming'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type ProcessingDayListQuery = z.infer<typeof processingDayListQuerySchema>;

// ---- bookings ----

/** One line of a booking: head from a grow-out group, or one animal (a cull). */
export const bookingItemSchema = z.union([
  z.strictObject({ groupId: recordId('The group'), head: wholeHead('head', 1, 500) }),
  z.strictObject({ animalId: recordId('The animal') }),
]);
export type BookingItem = z.infer<typeof bookingItemSchema>;

const bookingItems = z
  .array(bookingItemSchema)
  .min(1, 'Choose the animals to bring')
  .max(50, 'At most 50 lines in one booking')
  .refine((items) => new Set(items.map((i) => ('groupId' in i ? i.groupId : i.animalId))).size === items.length, 'Each group or animal once');

export const bookingCreateSchema = z.strictObject({
  /** Chosen by the client once per attempt: a double click or a retry answers the same booking. */
  idempotencyKey: z.uuid({ message: 'Send an idempotency key' }),
  farmId: recordId('The farm'),
  items: bookingItems,
});
export type BookingCreateInput = z.infer<typeof bookingCreateSchema>;

export const bookingChangeSchema = z.strictObject({ version, items: bookingItems });
export type BookingChangeInput = z.infer<typeof bookingChangeSchema>;

export const bookingCancelSchema = z.strictObject({ version, reason: multiLine(300).default('') });
export type BookingCancelInput = z.infer<typeof bookingCancelSchema>;

export const bookingConfirmSchema = z.strictObject({ version });

export const checkInSchema = z.strictObject({
  version,
  headBrought: wholeHead('head brought', 0, 500),
});
export type CheckInInput = z.infer<typeof checkInSchema>;

export const candidatesQuerySchema = z.strictObject({ farmId: z.uuid({ message: 'Choose the farm' }) });

// ---- roster and equipment ----

export const rosterSignUpSchema = z.strictObject({
  /** The admin or host may put someone else on the roster; by default the asking person. */
  userId: z.uuid().optional(),
});
export type RosterSignUpInput = z.infer<typeof rosterSignUpSchema>;

export const equipmentClaimSchema = z.strictObject({ farmId: recordId('The farm bringing it') });

/** A farm's own choice: whether its apprentices may sign up for stations (their mentors are the farm's members). */
export const processingFarmSettingsSchema = z.strictObject({ apprenticesMayStaff: z.boolean() });
export type ProcessingFarmSettingsInput = z.infer<typeof processingFarmSettingsSchema>;

// ---- the day itself ----

export const carcassOutcomes = ['passed', 'trimmed', 'condemned'] as const;
export type CarcassOutcome = (typeof carcassOutcomes)[number];

const grams = (what: string) => z.number({ message: `Enter the ${what}` }).int(`Give the ${what} in whole grams`).positive(`The ${what} must be above zero`);

/** Yields of a batch (or one animal) of a booking, written as the farm's processing record. */
export const dayYieldCreateSchema = z
  .strictObject({
    id: recordId('The record').optional(),
    bookingId: recordId('The booking'),
    groupId: recordId('The group').optional(),
    animalId: recordId('The animal').optional(),
    headCount: wholeHead('head', 1, 500).default(1),
    liveGrams: grams('live weight'),
    hotCarcassGrams: grams('hot carcass weight'),
    chilledCarcassGrams: grams('chilled carcass weight').nullable().default(null),
    /** Of the record's head: trimmed or condemned carcasses and why. */
    trimmedHead: wholeHead('trimmed head', 0, 500).default(0),
    condemnedHead: wholeHead('condemned head', 0, 500).default(0),
    outcomeReason: multiLine(300).default(''),
    notes: multiLine(1000).default(''),
  })
  .superRefine((v, ctx) => {
    if (Boolean(v.animalId) === Boolean(v.groupId)) ctx.addIssue({ code: 'custom', path: ['groupId'], message: 'Choose the group or the animal (one of them)' });
    if (v.trimmedHead + v.condemnedHead > v.headCount) ctx.addIssue({ code: 'custom', path: ['condemnedHead'], message: 'More trimmed and condemned than head in the record' });
    if (v.trimmedHead + v.condemnedHead > 0 && v.outcomeReason.length < 3) ctx.addIssue({ code: 'custom', path: ['outcomeReason'], message: 'Say why carcasses were trimmed or condemned' });
    if (v.hotCarcassGrams > v.liveGrams) ctx.addIssue({ code: 'custom', path: ['hotCarcassGrams'], message: 'The hot carcass weighs more than the live weight' });
  });
export type DayYieldCreateInput = z.infer<typeof dayYieldCreateSchema>;
export type DayYieldCreateBody = z.input<typeof dayYieldCreateSchema>;

/** After the day: the actual shared costs (default: the expected ones) split by head processed. */
export const dayCloseSchema = z.strictObject({
  version,
  actualCosts: z.array(costLineSchema).max(20).optional(),
});
export type DayCloseInput = z.infer<typeof dayCloseSchema>;
