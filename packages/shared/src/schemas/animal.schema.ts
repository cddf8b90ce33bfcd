import { z } from 'zod';
import { ageClasses } from '../herd/age-class';
import { EARLIEST_RECORD_DATE, isIsoDate, isRecordDate, LATEST_RECORD_DATE } from '../herd/herd-dates';
import { dispositions, lifecycles, purities, sexes } from '../herd/herd-enums';
import { multiLine, singleLine, recordId } from './text';

/** A calendar date as the farm sees it (trade events are dates, not instants), within the range a record may carry. */
export const calendarDateSchema = z
  .string({ message: 'Enter a date' })
  .refine(isIsoDate, 'Enter a date as YYYY-MM-DD')
  .refine((value) => !isIsoDate(value) || isRecordDate(value), `Enter a date from ${EARLIEST_RECORD_DATE} to ${LATEST_RECORD_DATE}`);


export const tattooSchema = z
  .string({ message: 'Enter the ear tattoo' })
  .trim()
  .min(1, 'Enter the ear tattoo')
  .max(20, 'An ear tattoo has at most 20 characters')
  .regex(/^[A-Za-z0-9][A-Za-z0-9-]*$/, 'Use letters, digits and hyphens (e.g. HR-14)');

const optionalTattoo = z
  .string()
  .trim()
  .max(20, 'An ear tattoo has at most 20 characters')
  .regex(/^([A-Za-z0-9][A-Za-z0-9-]*)?$/, 'Use letters, digits and hyphens (e.g. HR-14)')
  .transform((v) => (v === '' ? null : v))
  .nullable();

const registrationSchema = z
  .string()
  .trim()
  .max(40, 'A registration number has at most 40 characters')
  .transform((v) => (v === '' ? null : v))
  .nullable();

const animalName = singleLine('The name', 0, 60);
const colourSchema = singleLine('The colour', 0, 60);
const noteText = (max: number) => multiLine(max, `Keep it under ${max} characters`);

/** An ancestor known only from papers, entered as a parent (its sex follows from sire or dam). */
export const fromPapersSchema = z.strictObject({
  name: singleLine('The name on the papers', 1, 60),
  tattoo: optionalTattoo.default(null),
  registrationNumber: registrationSchema.default(null),
  breedId: recordId('The breed').nullable().default(null),
  colour: colourSchema.default(''),
  birthDate: calendarDateSchema.nullable().default(null),
  breederName: noteText(120).default(''),
});
export type FromPapersInput = z.infer<typeof fromPapersSchema>;

const animalFields = {
  tattoo: tattooSchema,
  name: animalName,
  sex: z.enum(sexes, { message: 'Choose buck or doe' }),
  breedId: recordId('The breed').nullable(),
  colour: colourSchema,
  birthDate: calendarDateSchema,
  sireId: recordId('The sire').nullable(),
  damId: recordId('The dam').nullable(),
  sireFromPapers: fromPapersSchema.optional(),
  damFromPapers: fromPapersSchema.optional(),
  registrationNumber: registrationSchema,
  hutch: singleLine('The hutch', 0, 40),
  notes: noteText(2000),
};

function parentsNotTwice(value: { sireId?: string | null; damId?: string | null; sireFromPapers?: unknown; damFromPapers?: unknown }, ctx: z.RefinementCtx) {
  if (value.sireId && value.sireFromPapers) ctx.addIssue({ code: 'custom', path: ['sireFromPapers'], message: 'Pick a sire or enter one from papers, not both' });
  if (value.damId && value.damFromPapers) ctx.addIssue({ code: 'custom', path: ['damFromPapers'], message: 'Pick a dam or enter one from papers, not both' });
}

/** A new animal on the actor's farm: born here, or arrived (bought, gifted) with `arrivedOn`. */
export const animalCreateSchema = z
  .strictObject({
    /** Client-generated, so a retried create cannot make two animals. */
    id: recordId('The animal').optional(),
    ...animalFields,
    name: animalFields.name.default(''),
    breedId: animalFields.breedId.default(null),
    colour: animalFields.colour.default(''),
    sireId: animalFields.sireId.default(null),
    damId: animalFields.damId.default(null),
    registrationNumber: animalFields.registrationNumber.default(null),
    hutch: animalFields.hutch.default(''),
    notes: animalFields.notes.default(''),
    lifecycle: z.enum(lifecycles, { message: 'Choose kit, junior, breeding or retired' }).optional(),
    origin: z.enum(['born_here', 'arrived']).default('born_here'),
    arrivedOn: calendarDateSchema.optional(),
    /** Who bred it, when that was not a co-op farm. */
    breederName: noteText(120).default(''),
    /** Set on a resubmit after a warning (e.g. a young parent), to save anyway. */
    confirm: z.boolean().optional(),
  })
  .superRefine((value, ctx) => {
    parentsNotTwice(value, ctx);
    if (value.origin === 'arrived' && !value.arrivedOn) ctx.addIssue({ code: 'custom', path: ['arrivedOn'], message: 'Enter the date it arrived' });
    if (value.arrivedOn && value.arrivedOn < value.birthDate) ctx.addIssue({ code: 'custom', path: ['arrivedOn'], message: 'It cannot arrive before it was born' });
  });
export type AnimalCreateInput = z.infer<typeof animalCreateSchema>;
/** The request body as a client sends it (defaults not yet applied). */
export type AnimalCreateBody = z.input<typeof animalCreateSchema>;

/** An edit names only the fields it changes and carries the version it was made from. */
export const animalUpdateSchema = z
  .strictObject({
    tattoo: animalFields.tattoo.optional(),
    name: animalFields.name.optional(),
    sex: animalFields.sex.optional(),
    breedId: animalFields.breedId.optional(),
    colour: animalFields.colour.optional(),
    birthDate: animalFields.birthDate.optional(),
    sireId: animalFields.sireId.optional(),
    damId: animalFields.damId.optional(),
    sireFromPapers: animalFields.sireFromPapers,
    damFromPapers: animalFields.damFromPapers,
    registrationNumber: animalFields.registrationNumber.optional(),
    hutch: animalFields.hutch.optional(),
    notes: animalFields.notes.optional(),
    version: z.number({ message: 'The version is required' }).int().min(0),
    confirm: z.boolean().optional(),
  })
  .superRefine(parentsNotTwice);
export type AnimalUpdateInput = z.infer<typeof animalUpdateSchema>;
export type AnimalUpdateBody = z.input<typeof animalUpdateSchema>;

export const herdStatusFilters = ['current', 'kit', 'junior', 'breeding', 'retired', 'gone', 'all'] as const;
export type HerdStatusFilter = (typeof herdStatusFilters)[number];
export const herdSortKeys = ['tattoo', 'name', 'sex', 'breed', 'birthDate', 'lifecycle', 'hutch', 'coi'] as const;
export type HerdSortKey = (typeof herdSortKeys)[number];

/** GET /api/animals: the actor's own herd. Query strings arrive as text, hence the coercions. */
export const animalListQuerySchema = z.strictObject({
  search: z.string().trim().max(60).optional(),
  sex: z.enum(sexes).optional(),
  status: z.enum(herdStatusFilters).default('current'),
  breedId: recordId('The breed').optional(),
  ageClass: z.enum(ageClasses).optional(),
  purity: z.enum(purities).optional(),
  sort: z.enum(herdSortKeys).default('tattoo'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type AnimalListQuery = z.infer<typeof animalListQuerySchema>;

export const statusEventSchema = z
  .strictObject({
    kind: z.enum(['lifecycle', 'disposition']),
    value: z.enum([...lifecycles, ...dispositions]),
    cause: singleLine('The cause', 0, 200).optional(),
    effectiveOn: calendarDateSchema,
  })
  .superRefine((value, ctx) => {
    const allowed: readonly string[] = value.kind === 'lifecycle' ? lifecycles : dispositions;
    if (!allowed.includes(value.value)) ctx.addIssue({ code: 'custom', path: ['value'], message: `Not a ${value.kind} status` });
    if (value.kind === 'disposition' && value.value === 'culled' && !value.cause) {
      ctx.addIssue({ code: 'custom', path: ['cause'], message: 'Say why it was culled' });
    }
    if (value.kind === 'disposition' && value.value === 'transferred') {
      ctx.addIssue({ code: 'custom', path: ['value'], message: 'Record a transfer as a move to the other farm' });
    }
  });
export type StatusEventInput = z.infer<typeof statusEventSchema>;

/** A move between farms recorded by the owning farm: a transfer of ownership, a loan out, a return. */
export const custodyMoveSchema = z
  .strictObject({
    kind: z.enum(['transferred', 'lent', 'returned']),
    toFarmId: recordId('The farm').optional(),
    movedOn: calendarDateSchema,
    /** When the tattoo clashes at the destination: the new tattoo (re-tattooed or with a farm suffix). */
    newTattoo: tattooSchema.optional(),
    note: noteText(500).default(''),
  })
  .superRefine((value, ctx) => {
    if (value.kind !== 'returned' && !value.toFarmId) ctx.addIssue({ code: 'custom', path: ['toFarmId'], message: 'Choose the farm it goes to' });
  });
export type CustodyMoveInput = z.infer<typeof custodyMoveSchema>;

export const pedigreeQuerySchema = z.strictObject({
  generations: z.coerce.number().int().min(1, 'At least one generation').max(6, 'At most six generations').default(4),
});

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

/** GET /api/pedigree-cards: co-op-wide, for choosing sires, dams and bucks to try. */
export const pedigreeCardQuerySchema = z.strictObject({
  search: z.string().trim().max(60).optional(),
  sex: z.enum(sexes).optional(),
  farmId: recordId('The farm').optional(),
  /** Only animals alive on a co-op farm (no outside or departed ones). */
  onFarm: booleanQuery.optional(),
  /** Only animals in the breeding stage (not kits, juniors or retired ones): bucks one could use. */
  breeding: booleanQuery.optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type PedigreeCardQuery = z.infer<typeof pedigreeCardQuerySchema>;

export const trialMatingSchema = z.strictObject({
  damId: recordId('The doe'),
  sireIds: z.array(recordId('A buck')).min(1, 'Pick at least one buck').max(12, 'Compare at most 12 bucks at once'),
});
export type TrialMatingInput = z.infer<typeof trialMatingSchema>;

/** An outside animal for the co-op registry (found again when its registration, or tattoo and name, match). */
export const outsideAnimalSchema = fromPapersSchema.extend({
  sex: z.enum(sexes, { message: 'Choose buck or doe' }),
  sireId: recordId('The sire').nullable().default(null),
  damId: recordId('The dam').nullable().default(null),
});
export type OutsideAnimalInput = z.infer<typeof outsideAnimalSchema>;

export const outsideAnimalQuerySchema = z.strictObject({
  search: z.string().trim().max(60).optional(),
});

export const outsideMergeSchema = z.strictObject({
  intoId: recordId('The record to keep'),
});

/** Columns the Herd table can show; the choice is kept in the address (`cols`, comma-separated). */
export const herdColumns = ['tattoo', 'name', 'sex', 'breed', 'purity', 'ageClass', 'birthDate', 'lifecycle', 'cycle', 'hutch', 'coi', 'weight', 'custody'] as const;
export type HerdColumn = (typeof herdColumns)[number];
export const defaultHerdColumns: readonly HerdColumn[] = ['tattoo', 'name', 'sex', 'breed', 'purity', 'ageClass', 'lifecycle', 'cycle', 'coi', 'weight'];

/** The Herd screen's address: the list query plus the chosen columns. */
export const herdViewSchema = animalListQuerySchema.extend({
  cols: z
    .string()
    .max(200)
    .regex(/^[a-zA-Z,]*$/)
    .default(defaultHerdColumns.join(',')),
});
export type HerdView = z.infer<typeof herdViewSchema>;

/** The trial-mating screen's address: the bucks picked so far, so the comparison survives a reload. */
export const trialMatingViewSchema = z.strictObject({
  bucks: z
    .string()
    .max(12 * 37)
    .regex(/^[0-9a-f,-]*$/)
    .default(''),
});
