import { z } from 'zod';
import { bodyTypes, sizeClasses } from '../herd/herd-enums';
import { singleLine } from './text';

const grams = (what: string) =>
  z.number({ message: `${what} must be a number of grams` }).int().min(100, `${what} looks too light`).max(20_000, `${what} looks too heavy`).nullable();
const days = (what: string) =>
  z.number({ message: `${what} must be a number of days` }).int().min(60, `${what}: at least 60 days`).max(730, `${what}: at most 730 days`);

/** An admin adds a breed the catalogue lacks, for their co-op only; weights in grams. */
export const breedCreateSchema = z
  .strictObject({
    name: singleLine('The breed name', 2, 60),
    seniorBuckMinGrams: grams('Senior buck minimum').default(null),
    seniorBuckMaxGrams: grams('Senior buck maximum').default(null),
    seniorDoeMinGrams: grams('Senior doe minimum').default(null),
    seniorDoeMaxGrams: grams('Senior doe maximum').default(null),
    sizeClass: z.enum(sizeClasses, { message: 'Choose small, medium, large or giant' }),
    bodyType: z.enum(bodyTypes).nullable().default(null),
    doeFirstBreedingMinDays: days('Does first bred from').optional(),
    buckFirstBreedingMinDays: days('Bucks first bred from').optional(),
    slowGrowing: z.boolean().default(false),
    heavyBoned: z.boolean().default(false),
    meatNotes: z.string().trim().max(500).default(''),
    /** Where the figures come from (a standard, a breeder's club, the breeder's own experience). */
    source: singleLine('The source of these figures', 2, 200),
  })
  .superRefine((v, ctx) => {
    if (v.seniorBuckMinGrams !== null && v.seniorBuckMaxGrams !== null && v.seniorBuckMaxGrams < v.seniorBuckMinGrams) {
      ctx.addIssue({ code: 'custom', path: ['seniorBuckMaxGrams'], message: 'The maximum is below the minimum' });
    }
    if (v.seniorDoeMinGrams !== null && v.seniorDoeMaxGrams !== null && v.seniorDoeMaxGrams < v.seniorDoeMinGrams) {
      ctx.addIssue({ code: 'custom', path: ['seniorDoeMaxGrams'], message: 'The maximum is below the minimum' });
    }
  });
export type BreedCreateInput = z.infer<typeof breedCreateSchema>;
