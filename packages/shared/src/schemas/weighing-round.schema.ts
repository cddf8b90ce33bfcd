import { z } from 'zod';
import type { WeightBand, DatedWeight } from '../growth/weighing-checks';
import type { ReviewState, Sex } from '../herd/herd-enums';
import { calendarDateSchema } from './animal.schema';
import { recordId } from './text';

/**
 * GET /api/weighing-rounds/candidates: what a round weighs, in order. A grow-out group or a litter is
 * weighed kit by kit; "growing" is every young animal the farm keeps and every growing group.
 */
export const weighingRoundSetSchema = z.discriminatedUnion('set', [
  z.strictObject({ set: z.literal('group'), groupId: recordId('The group') }),
  z.strictObject({ set: z.literal('litter'), litterId: recordId('The litter') }),
  z.strictObject({ set: z.literal('growing') }),
  z.strictObject({
    set: z.literal('animals'),
    animalIds: z
      .string()
      .transform((v) => v.split(',').filter(Boolean))
      .pipe(z.array(recordId('The animal')).min(1, 'Choose at least one animal').max(200, 'At most 200 animals in one round')),
  }),
], { message: 'Choose what to weigh: a group, a litter, the growing animals or chosen animals' });
export type WeighingRoundSetQuery = z.infer<typeof weighingRoundSetSchema>;

export const WEIGHING_ROUND_MAX_ENTRIES = 300;

/**
 * POST /api/weighing-rounds: a whole round saved at once. The id is the client's idempotency key (the
 * same round sent again answers the first save). Each weight is whole grams for one head; the weights of
 * a group's or a litter's kits become one weigh-in of that group or litter.
 */
export const weighingRoundCreateSchema = z.strictObject({
  id: z.uuid({ message: 'Not a valid id' }),
  weighedOn: calendarDateSchema,
  entries: z
    .array(
      z
        .strictObject({
          animalId: recordId('The animal').optional(),
          groupId: recordId('The group').optional(),
          litterId: recordId('The litter').optional(),
          grams: z.number({ message: 'Enter the weight' }).int('Weights are whole grams').min(1, 'Enter a weight above zero').max(100_000, 'That is more than any rabbit weighs'),
          /** The breeder saw the warning for this weight and keeps it. */
          confirmed: z.boolean().default(false),
        })
        .refine((e) => [e.animalId, e.groupId, e.litterId].filter(Boolean).length === 1, { message: 'Each weight is of one animal, group or litter', path: ['animalId'] }),
      { message: 'Weigh at least one animal' },
    )
    .min(1, 'Weigh at least one animal')
    .max(WEIGHING_ROUND_MAX_ENTRIES, `At most ${WEIGHING_ROUND_MAX_ENTRIES} weights in one round`),
});
export type WeighingRoundCreateInput = z.infer<typeof weighingRoundCreateSchema>;
export type WeighingRoundCreateBody = z.input<typeof weighingRoundCreateSchema>;

/** One head to weigh: an animal, or kit n of a group or litter. */
export interface WeighingRoundCandidateDto {
  kind: 'animal' | 'group' | 'litter';
  /** The animal's, group's or litter's id. */
  id: string;
  /** For kits: which of the group's or litter's heads (1-based) and how many there are. */
  kitNumber: number | null;
  kitCount: number | null;
  label: string;
  detail: string;
  sex: Sex | null;
  ageDays: number | null;
  /** Its last weight per head (pending ones included: they are the latest word). */
  last: DatedWeight | null;
  band: WeightBand | null;
  sizeClass: 'small' | 'medium' | 'large' | 'giant';
}

export interface WeighingRoundCandidatesDto {
  title: string;
  today: string;
  candidates: WeighingRoundCandidateDto[];
}

export interface WeighingRoundDto {
  id: string;
  weighedOn: string;
  enteredBy: { id: string; name: string };
  reviewState: ReviewState;
  weighIns: { id: string; kind: 'animal' | 'group' | 'litter'; subjectId: string; totalGrams: number; headCount: number }[];
}
