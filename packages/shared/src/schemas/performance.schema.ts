import { z } from 'zod';
import { recordId } from './text';
import { calendarDateSchema } from './animal.schema';
import type { PerformanceTables } from '../yield/performance-tables';

/**
 * The performance screen's period: the last 12 months to the farm's today (default), every record,
 * or dates of the breeder's choosing.
 */
export const performancePeriods = ['last_12_months', 'all', 'custom'] as const;
export type PerformancePeriodChoice = (typeof performancePeriods)[number];

export const performanceQuerySchema = z
  .strictObject({
    period: z.enum(performancePeriods, { message: 'Choose the last 12 months, all records or your own dates' }).default('last_12_months'),
    from: calendarDateSchema.optional(),
    to: calendarDateSchema.optional(),
    /** Default: the signed-in person's farm (an apprentice: the mentor's). Another farm's answers 404. */
    farmId: recordId('The farm').optional(),
  })
  .superRefine((v, ctx) => {
    if (v.period !== 'custom') return;
    if (!v.from) ctx.addIssue({ code: 'custom', path: ['from'], message: 'Enter the first day of the period' });
    if (!v.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'Enter the last day of the period' });
    if (v.from && v.to && v.to < v.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The period ends before it starts' });
  });
export type PerformanceQuery = z.infer<typeof performanceQuerySchema>;

/** The farm's performance tables as the screen gets them; money fields are null unless `showsMoney`. */
export interface PerformanceDto extends PerformanceTables {
  farmId: string;
  periodChoice: PerformancePeriodChoice;
  today: string;
  /** False for apprentices: no prices or costs anywhere in the answer. */
  showsMoney: boolean;
}
