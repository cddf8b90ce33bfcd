import { z } from 'zod';
import { calendarDateSchema } from './animal.schema';
import { singleLine, recordId } from './text';


/**
 * A grow-out group formed from kits of one or more of the farm's litters. The target live weight per
 * head defaults to the farm's last group's, else 2,270 g (≈ 5 lb, the usual fryer at 8–10 weeks —
 * common practice; Oregon State Ext. Bulletin 745 gives 4–5 lb at 8 weeks).
 */
export const growOutGroupCreateSchema = z.strictObject({
  id: recordId('The group').optional(),
  name: singleLine('The group name', 1, 60),
  formedOn: calendarDateSchema,
  targetGrams: z
    .number({ message: 'Enter the target weight' })
    .int('Weights are whole grams')
    .min(500, 'A target under 500 g is not a market weight')
    .max(8000, 'A target over 8 kg is beyond any fryer or roaster'),
  housingUnitId: recordId('The pen').nullable().optional(),
  litters: z
    .array(
      z.strictObject({
        litterId: recordId('The litter'),
        heads: z.number({ message: 'Enter how many kits' }).int('Whole kits').min(1, 'At least one kit').max(30, 'No litter has more than 30 kits'),
      }),
      { message: 'Pick at least one litter' },
    )
    .min(1, 'Pick at least one litter')
    .max(12, 'A group takes kits of at most 12 litters'),
  notes: z.string().trim().max(1000).default(''),
});
export type GrowOutGroupCreateInput = z.infer<typeof growOutGroupCreateSchema>;
export type GrowOutGroupCreateBody = z.input<typeof growOutGroupCreateSchema>;

export const KIT_LABEL_MAX = 30;

/**
 * A group weigh-in: the total on the scale with the head count, or the kits one by one (each may carry a
 * label such as an ear mark, so its own gain can be followed from one weigh-in to the next).
 */
export const groupWeighInCreateSchema = z
  .strictObject({
    id: recordId('The weigh-in').optional(),
    weighedOn: calendarDateSchema,
    totalGrams: z.number({ message: 'Enter the total weight' }).int('Weights are whole grams').min(1, 'Enter a weight above zero').max(1_000_000, 'That is more than a tonne; check the weight').optional(),
    headCount: z.number({ message: 'Enter the head count' }).int('Whole heads').min(1, 'At least one head').max(500).optional(),
    kits: z
      .array(
        z.strictObject({
          label: z.string().trim().max(KIT_LABEL_MAX, `Keep a kit's label under ${KIT_LABEL_MAX} characters`).optional(),
          grams: z.number({ message: 'Enter the weight' }).int('Weights are whole grams').min(1, 'Enter a weight above zero').max(20_000, 'No rabbit weighs that much'),
        }),
      )
      .min(1, 'Weigh at least one kit')
      .max(300)
      .optional(),
    note: z.string().trim().max(500).default(''),
  })
  .superRefine((v, ctx) => {
    if (v.kits) {
      if (v.totalGrams !== undefined || v.headCount !== undefined) ctx.addIssue({ code: 'custom', path: ['totalGrams'], message: 'Give the total and head count, or the kits one by one, not both' });
      const labels = v.kits.map((k) => k.label).filter((l): l is string => Boolean(l));
      if (new Set(labels.map((l) => l.toLowerCase())).size !== labels.length) ctx.addIssue({ code: 'custom', path: ['kits'], message: 'Two kits carry the same label' });
      return;
    }
    if (v.totalGrams === undefined) ctx.addIssue({ code: 'custom', path: ['totalGrams'], message: 'Enter the total weight' });
    if (v.headCount === undefined) ctx.addIssue({ code: 'custom', path: ['headCount'], message: 'Enter the head count' });
  });
export type GroupWeighInCreateInput = z.infer<typeof groupWeighInCreateSchema>;
export type GroupWeighInCreateBody = z.input<typeof groupWeighInCreateSchema>;

export const growOutGroupCloseSchema = z.strictObject({
  closedOn: calendarDateSchema,
  version: z.number().int().min(0),
});
export type GrowOutGroupCloseInput = z.infer<typeof growOutGroupCloseSchema>;

export const growOutListQuerySchema = z.object({
  status: z.enum(['growing', 'closed', 'all']).default('growing'),
  readyBy: calendarDateSchema.optional(),
});
export type GrowOutListQuery = z.infer<typeof growOutListQuerySchema>;
