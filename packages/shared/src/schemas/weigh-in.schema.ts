import { z } from 'zod';
import { multiLine, singleLine, recordId } from './text';
import { calendarDateSchema } from './animal.schema';
import { pageSchema } from './application.schema';

/** A weigh-in of one animal (head count 1) or of a group (a litter, a pen) as a total over a head count. */
export const weighInCreateSchema = z
  .strictObject({
    id: z.uuid({ message: 'Not a valid id' }).optional(),
    animalId: recordId('The animal').optional(),
    groupLabel: singleLine('The group name', 0, 60).refine((v) => v.length > 0, 'Name the group').optional(),
    totalGrams: z
      .number({ message: 'Enter the weight' })
      .int('Weights are whole grams')
      .min(1, 'Enter a weight above zero')
      .max(1_000_000, 'That is more than a tonne; check the weight'),
    headCount: z.number().int().min(1, 'At least one head').max(500).default(1),
    weighedOn: calendarDateSchema,
    note: multiLine(500).default(''),
  })
  .superRefine((v, ctx) => {
    if (!v.animalId && !v.groupLabel) ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'Weigh an animal or name a group' });
    if (v.animalId && v.groupLabel) ctx.addIssue({ code: 'custom', path: ['groupLabel'], message: 'An animal or a group, not both' });
    if (v.animalId && v.headCount !== 1) ctx.addIssue({ code: 'custom', path: ['headCount'], message: 'One animal is one head' });
  });
export type WeighInCreateInput = z.infer<typeof weighInCreateSchema>;

/** The mentor's decision on an apprentice's entry. */
export const entryReviewSchema = z.strictObject({
  decision: z.enum(['accepted', 'returned'], { message: 'Accept or return it' }),
  comment: z.string().trim().max(500).optional(),
  version: z.number().int().min(0),
});
export type EntryReviewInput = z.infer<typeof entryReviewSchema>;

export const animalNoteCreateSchema = z.strictObject({
  body: multiLine(2000, 'Keep the note under 2,000 characters').refine((v) => v.length > 0, 'Write the note'),
  notedOn: calendarDateSchema,
});
export type AnimalNoteCreateInput = z.infer<typeof animalNoteCreateSchema>;

/**
 * GET /api/animals/:id/weigh-ins: one animal's series, paged in SQL by weighing date. The default page
 * holds a whole life's weigh-ins, which the weight chart draws at once.
 */
export const weighInListQuerySchema = z.strictObject({
  dir: z.enum(['asc', 'desc'], { message: 'Choose asc or desc' }).default('asc'),
  page: pageSchema,
  pageSize: z.coerce.number({ message: 'Choose how many a page' }).int('Choose how many a page').min(1, 'At least one a page').max(500, 'At most 500 a page').default(500),
});
export type WeighInListQuery = z.infer<typeof weighInListQuerySchema>;
