import { z } from 'zod';
import { multiLine, singleLine, recordId } from './text';
import { sexes } from '../herd/herd-enums';
import { calendarDateSchema, tattooSchema } from './animal.schema';
import { pageSchema, pageSizeSchema } from './application.schema';
import { kitDeathCauses } from '../breeding/breeding-record';

/**
 * Inputs for litters. A litter's kit count is never typed in: the kindling gives born alive and
 * born dead, and every later change is a dated event (lost with a cause, culled, weaned, fostered in or
 * out naming the other litter). Counts are whole numbers, 0 or more for the kindling, at least 1 for an
 * event; the checks that need the litter's history (more kits leaving than were with the doe, a date
 * before the kindling or in the farm's future) run on the server with the shared litter-count rules.
 */

const noteText = (max: number) => multiLine(max);

const kitCount = (what: string, min: number) =>
  z
    .number({ message: `${what}: enter a number of kits` })
    .int(`${what}: whole kits only`)
    .min(min, min === 0 ? `${what} cannot be negative` : `${what}: at least ${min} kit`)
    .max(30, `${what}: more than 30 kits is not a rabbit litter; check the number`);

/** The kindling: which service it came from (so sire and dam are fixed), the date, born alive and dead. */
export const kindlingCreateSchema = z.strictObject({
  id: recordId('The litter').optional(),
  serviceId: recordId('The service'),
  kindledOn: calendarDateSchema,
  bornAlive: kitCount('Born alive', 0),
  bornDead: kitCount('Born dead', 0),
  notes: noteText(1000).default(''),
  /** Set on a resubmit after a warning (outside the kindling window), to save anyway. */
  confirm: z.boolean().optional(),
});
export type KindlingCreateInput = z.infer<typeof kindlingCreateSchema>;
export type KindlingCreateBody = z.input<typeof kindlingCreateSchema>;

/** Kits leaving the doe without another litter: lost (with a cause), culled, weaned. */
export const litterEventCreateSchema = z
  .strictObject({
    id: recordId('The event').optional(),
    kind: z.enum(['lost', 'culled', 'weaned'], { message: 'Choose lost, culled or weaned' }),
    on: calendarDateSchema,
    count: kitCount('Kits', 1),
    /** Lost kits only: why they died, from the list the doe's record counts. */
    deathCause: z.enum(kitDeathCauses, { message: 'Choose why the kits died (cause unknown is a cause)' }).optional(),
    /** What happened, in words (a lost kit's note beside its cause; a cull's reason). */
    cause: noteText(200).optional(),
    /**
     * A weaning only: the total live weight of the kits weaned, in grams (optional). Its weight a kit
     * for their age is checked on the server (growth/plausibility.ts).
     */
    weaningWeightGrams: z
      .number({ message: 'The litter weight: enter a weight' })
      .int('The litter weight: whole grams only')
      .min(1, 'The litter weight must be above zero')
      .max(600_000, 'The litter weight is more than any litter weighs; check the weight')
      .nullable()
      .optional(),
    /** Set on a resubmit after a warning (a litter weight unusual for the age), to save anyway. */
    confirm: z.boolean().optional(),
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'lost' && !v.deathCause && !v.cause?.trim()) {
      ctx.addIssue({ code: 'custom', path: ['cause'], message: 'Say what happened (cause unknown is a cause)' });
    }
    if (v.kind !== 'lost' && v.deathCause) {
      ctx.addIssue({ code: 'custom', path: ['deathCause'], message: 'A cause of death goes with lost kits only' });
    }
    if (v.kind !== 'weaned' && v.weaningWeightGrams != null) {
      ctx.addIssue({ code: 'custom', path: ['weaningWeightGrams'], message: 'A litter weight goes with a weaning only' });
    }
  });
export type LitterEventCreateInput = z.infer<typeof litterEventCreateSchema>;

/**
 * Kits moved to another doe's litter, or taken in from one. The other litter may be on another farm of
 * the co-op; then only the giving farm records it ("out"), and the other farm sees the kits arrive.
 * Fostering never changes parentage: the kits stay the offspring of the litter they were born in.
 */
export const fosteringCreateSchema = z.strictObject({
  id: recordId('The fostering').optional(),
  direction: z.enum(['out', 'in'], { message: 'Fostered out of this litter, or in from the other?' }),
  otherLitterId: recordId('The other litter'),
  on: calendarDateSchema,
  count: kitCount('Kits', 1),
});
export type FosteringCreateInput = z.infer<typeof fosteringCreateSchema>;

/** A kit picked to keep: its own animal record with its tattoo; sire, dam and birth date come from the litter it was born in. */
export const keeperCreateSchema = z.strictObject({
  id: recordId('The animal').optional(),
  tattoo: tattooSchema,
  name: singleLine('The name', 0, 60).default(''),
  sex: z.enum(sexes, { message: 'Choose buck or doe' }),
  colour: singleLine('The colour', 0, 60).default(''),
  /** When the kit was fostered in: the litter it was born in (its parentage). Default: this litter. */
  bornInLitterId: recordId('The litter it was born in').optional(),
});
export type KeeperCreateInput = z.infer<typeof keeperCreateSchema>;

export const litterStatusFilters = ['nursing', 'weaned', 'all'] as const;
export const litterSortKeys = ['kindledOn', 'bornAlive'] as const;
export type LitterSortKey = (typeof litterSortKeys)[number];

/** GET /api/litters: the farm's litters, filtered, sorted and paged on the server (the screen keeps them in its address). */
export const litterListQuerySchema = z.strictObject({
  status: z.enum(litterStatusFilters, { message: 'Choose nursing, weaned or all' }).default('all'),
  sort: z.enum(litterSortKeys, { message: 'Not a column the litters sort by' }).default('kindledOn'),
  dir: z.enum(['asc', 'desc'], { message: 'Choose asc or desc' }).default('desc'),
  /** One dam's litters only (the animal form offers her kindling days as a kit's birth date). */
  damId: recordId('The dam').optional(),
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type LitterListQuery = z.infer<typeof litterListQuerySchema>;

/** Hutches and pens: where animals and litters are housed (later issues allocate feed by pen). */
export const housingKinds = ['hutch', 'pen', 'colony', 'grow_out'] as const;
export type HousingKind = (typeof housingKinds)[number];

export const housingUnitCreateSchema = z.strictObject({
  name: singleLine('The name', 0, 40).refine((v) => v.length > 0, 'Name the hutch or pen'),
  kind: z.enum(housingKinds, { message: 'Choose hutch, pen, colony or grow-out pen' }),
  capacity: z.number().int().min(1, 'At least one place').max(200).nullable().default(null),
  notes: noteText(500).default(''),
});
export type HousingUnitCreateInput = z.infer<typeof housingUnitCreateSchema>;

export const placementCreateSchema = z
  .strictObject({
    animalId: recordId('The animal').optional(),
    litterId: recordId('The litter').optional(),
    placedOn: calendarDateSchema,
    note: noteText(200).default(''),
  })
  .superRefine((v, ctx) => {
    if (!v.animalId === !v.litterId) ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'Place one animal or one litter' });
  });
export type PlacementCreateInput = z.infer<typeof placementCreateSchema>;

export const placementEndSchema = z.strictObject({ endedOn: calendarDateSchema });
export type PlacementEndInput = z.infer<typeof placementEndSchema>;
