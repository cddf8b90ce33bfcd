import { z } from 'zod';
import { multiLine, singleLine, recordId } from './text';
import { isIsoDate } from '../herd/herd-dates';
import { readingToCelsius, TEMPERATURE_LIMITS_CELSIUS } from '../health/heat';
import { celsiusToFahrenheit } from '../units/units';
import { calendarDateSchema } from './animal.schema';

/**
 * Inputs of the Health tab. No drugs are approved for rabbits in the US: treatment is
 * extralabel and needs a veterinarian, who sets the withdrawal time before slaughter (Sundlof et al.,
 * JAVMA 1991; FARAD). A withdrawal is entered as its end date or as days after the last dose; one with
 * no end is refused, and "no withdrawal" is an explicit 0 days.
 */

const noteText = (max: number) => multiLine(max);

export const treatmentRoutes = ['oral', 'injection', 'topical', 'in_water', 'in_feed', 'other'] as const;
export type TreatmentRoute = (typeof treatmentRoutes)[number];
export const treatmentRouteLabels: Record<TreatmentRoute, string> = {
  oral: 'By mouth',
  injection: 'Injection',
  topical: 'On the skin',
  in_water: 'In the water',
  in_feed: 'In the feed',
  other: 'Other',
};

export const WITHDRAWAL_MISSING_MESSAGE =
  'Enter the withdrawal the veterinarian set: the day it ends, or the days after the last dose (0 if there is none)';

export const treatmentCreateSchema = z
  .strictObject({
    /** Client-generated, so a retried save cannot record the treatment twice. */
    id: recordId('The treatment').optional(),
    animalId: recordId('The animal').optional(),
    groupId: recordId('The group').optional(),
    treatment: singleLine('The treatment', 0, 200).refine((v) => v.length > 0, 'Say what the treatment is'),
    dose: z.string().trim().min(1, 'Give the dose the veterinarian prescribed').max(200, 'Keep it under 200 characters'),
    route: z.enum(treatmentRoutes, { message: 'Choose how it is given' }),
    veterinarian: singleLine('The name', 0, 120).refine((v) => v.length > 0, 'Name the veterinarian who prescribed it'),
    startedOn: calendarDateSchema,
    /** The last day of treatment (the last dose). */
    lastDoseOn: calendarDateSchema,
    /** The last day under withdrawal, as the veterinarian set it… */
    withdrawalEndsOn: calendarDateSchema.optional(),
    /** …or the days of withdrawal after the last dose (0 = none). */
    withdrawalDays: z.number({ message: 'Give the withdrawal in whole days' }).int('Give the withdrawal in whole days').min(0, 'Withdrawal days cannot be negative').max(3650, 'That withdrawal is longer than ten years').optional(),
    notes: noteText(1000).default(''),
  })
  .superRefine((v, ctx) => {
    if (Boolean(v.animalId) === Boolean(v.groupId)) {
      ctx.addIssue({ code: 'custom', path: ['animalId'], message: 'Choose the animal or the grow-out group that was treated (one of them)' });
    }
    const dates = isIsoDate(v.startedOn) && isIsoDate(v.lastDoseOn);
    if (dates && v.lastDoseOn < v.startedOn) {
      ctx.addIssue({ code: 'custom', path: ['lastDoseOn'], message: 'The last day of treatment cannot come before it starts' });
    }
    if (v.withdrawalEndsOn === undefined && v.withdrawalDays === undefined) {
      ctx.addIssue({ code: 'custom', path: ['withdrawalEndsOn'], message: WITHDRAWAL_MISSING_MESSAGE });
    }
    if (v.withdrawalEndsOn !== undefined && v.withdrawalDays !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['withdrawalDays'], message: 'Give the withdrawal one way: its end date or its days, not both' });
    }
    if (v.withdrawalEndsOn && isIsoDate(v.withdrawalEndsOn) && isIsoDate(v.lastDoseOn) && v.withdrawalEndsOn < v.lastDoseOn) {
      ctx.addIssue({ code: 'custom', path: ['withdrawalEndsOn'], message: 'The withdrawal cannot end before the last day of treatment' });
    }
  });
export type TreatmentCreateInput = z.infer<typeof treatmentCreateSchema>;
export type TreatmentCreateBody = z.input<typeof treatmentCreateSchema>;

export const treatmentListQuerySchema = z.strictObject({
  animalId: recordId('The animal').optional(),
  groupId: recordId('The group').optional(),
});

/** GET /api/withdrawals: one animal's or group's (or, with neither, all of the farm's current ones). */
export const withdrawalQuerySchema = z.strictObject({
  animalId: recordId('The animal').optional(),
  groupId: recordId('The group').optional(),
});
export type WithdrawalQuery = z.infer<typeof withdrawalQuerySchema>;

/** A temperature reading in the farm's unit; stored in °C to one decimal. */
export const temperatureReadingCreateSchema = z
  .strictObject({
    id: recordId('The reading').optional(),
    value: z.number({ message: 'Enter the temperature as a number' }).finite('Enter the temperature as a number'),
    unit: z.enum(['F', 'C'], { message: 'Choose °F or °C' }),
    /** When it was read (an instant); now if left out. */
    takenAt: z.iso.datetime({ offset: true, message: 'Give the time it was read' }).optional(),
    place: singleLine('The place', 0, 60).default(''),
  })
  .superRefine((v, ctx) => {
    if (!Number.isFinite(v.value)) return;
    const celsius = readingToCelsius(v.value, v.unit);
    const { min, max } = TEMPERATURE_LIMITS_CELSIUS;
    if (celsius < min || celsius > max) {
      const range = v.unit === 'F' ? `${celsiusToFahrenheit(min)} to ${Math.round(celsiusToFahrenheit(max))} °F` : `${min} to ${max} °C`;
      ctx.addIssue({ code: 'custom', path: ['value'], message: `${v.value} °${v.unit} is not a barn temperature; enter a reading between ${range}` });
    }
  });
export type TemperatureReadingCreateInput = z.infer<typeof temperatureReadingCreateSchema>;
export type TemperatureReadingCreateBody = z.input<typeof temperatureReadingCreateSchema>;
