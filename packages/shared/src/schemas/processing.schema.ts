import { z } from 'zod';
import { recordId } from './text';
import { MAX_RABBIT_GRAMS } from '../growth/plausibility';
import { calendarDateSchema } from './animal.schema';

/**
 * Inputs of the Processing tab: a processing record for one animal or a batch of a grow-out
 * group's heads (weights are the totals of the record's heads, in grams), and a mark for processing.
 * What the schema cannot know (the animal's farm, the group's heads left, a withdrawal, the farm's
 * today) the server checks.
 */

const grams = (what: string) =>
  z.number({ message: `Enter the ${what}` }).int(`Give the ${what} in whole grams`).positive(`The ${what} must be above zero`);

export const processingRecordCreateSchema = z
  .strictObject({
    id: recordId('The record').optional(),
    animalId: recordId('The animal').optional(),
    groupId: recordId('The group').optional(),
    processedOn: calendarDateSchema,
    headCount: z.number({ message: 'Enter how many were processed' }).int('Enter a whole number of heads').min(1, 'At least one head').max(500, 'At most 500 heads in one record').default(1),
    liveGrams: grams('live weight'),
    hotCarcassGrams: grams('hot carcass weight'),
    chilledCarcassGrams: grams('chilled carcass weight').nullable().default(null),
    notes: z.string().trim().max(1000, 'Keep it under 1,000 characters').default(''),
    /** The breeder saw the warning (a live weight far from the last weigh-in) and keeps the figures. */
    confirm: z.boolean().optional(),
  })
  .superRefine((v, ctx) => {
    if (Boolean(v.animalId) === Boolean(v.groupId)) {
      ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'Choose the animal or the grow-out group processed (one of them)' });
    }
    if (v.animalId && v.headCount !== 1) ctx.addIssue({ code: 'custom', path: ['headCount'], message: 'A record for one animal has one head' });
    if (v.liveGrams / v.headCount > MAX_RABBIT_GRAMS) {
      ctx.addIssue({ code: 'custom', path: ['liveGrams'], message: `${Math.round(v.liveGrams / v.headCount)} g a head is more than any rabbit weighs; check the weight and the head count` });
    }
    if (v.hotCarcassGrams > v.liveGrams) {
      ctx.addIssue({ code: 'custom', path: ['hotCarcassGrams'], message: `The hot carcass (${v.hotCarcassGrams} g) weighs more than the live weight (${v.liveGrams} g)` });
    }
    if (v.chilledCarcassGrams !== null && v.chilledCarcassGrams > v.hotCarcassGrams) {
      ctx.addIssue({ code: 'custom', path: ['chilledCarcassGrams'], message: `The chilled carcass (${v.chilledCarcassGrams} g) weighs more than the hot one (${v.hotCarcassGrams} g); check the weights` });
    }
  });
export type ProcessingRecordCreateInput = z.infer<typeof processingRecordCreateSchema>;
export type ProcessingRecordCreateBody = z.input<typeof processingRecordCreateSchema>;

export const processingMarkCreateSchema = z
  .strictObject({
    id: recordId('The mark').optional(),
    animalId: recordId('The animal').optional(),
    groupId: recordId('The group').optional(),
    plannedOn: calendarDateSchema,
    notes: z.string().trim().max(500, 'Keep it under 500 characters').default(''),
  })
  .superRefine((v, ctx) => {
    if (Boolean(v.animalId) === Boolean(v.groupId)) {
      ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'Choose the animal or the grow-out group to mark (one of them)' });
    }
  });
export type ProcessingMarkCreateInput = z.infer<typeof processingMarkCreateSchema>;
export type ProcessingMarkCreateBody = z.input<typeof processingMarkCreateSchema>;

export const processingMarkCancelSchema = z.strictObject({ version: z.number({ message: 'Send the version you saw' }).int().min(0) });
