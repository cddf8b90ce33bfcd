import { z } from 'zod';
import { multiLine, singleLine } from './text';

export const weightUnits = ['lb_oz', 'kg_g'] as const;
export const temperatureUnits = ['F', 'C'] as const;

function isIanaTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z
  .string()
  .min(1, 'Choose a time zone')
  .max(64)
  .refine(isIanaTimeZone, 'Choose a time zone such as America/Chicago');

export const farmProfileSchema = z.strictObject({
  name: singleLine('The name', 0, 80).refine((v) => v.length >= 2, 'A farm name has at least 2 characters'),
  location: singleLine('The location', 0, 120).refine((v) => v.length >= 2, 'Say where the farm is'),
  timeZone: timeZoneSchema,
  weightUnit: z.enum(weightUnits, { message: 'Choose pounds and ounces or kilograms and grams' }),
  temperatureUnit: z.enum(temperatureUnits, { message: 'Choose °F or °C' }),
  breedsKept: z
    .array(singleLine('A breed name', 1, 60))
    .max(20, 'List at most 20 breeds'),
  description: multiLine(1000, 'Keep the description under 1,000 characters'),
});
export type FarmProfileInput = z.infer<typeof farmProfileSchema>;

/** An edit carries the version it was made from, so a concurrent edit is refused instead of overwritten. */
export const farmProfileUpdateSchema = farmProfileSchema.extend({
  version: z.number().int().min(0),
});
export type FarmProfileUpdateInput = z.infer<typeof farmProfileUpdateSchema>;

export const uuidParamSchema = z.uuid({ message: 'Not a valid id' });
