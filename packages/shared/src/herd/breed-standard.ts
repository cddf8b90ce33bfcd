import type { Sex } from './herd-enums';

export interface WeightRange {
  minGrams: number | null;
  maxGrams: number | null;
}

export type WeightAgainstStandard = 'below' | 'within' | 'above' | 'no_standard';

/**
 * A senior's live weight against its breed's senior range for its sex (the ARBA Standard of Perfection's
 * senior weights, as carried by the breed catalogue). Juniors and intermediates are still growing, so only seniors are judged.
 */
export function weightAgainstStandard(grams: number, range: WeightRange | null): WeightAgainstStandard {
  if (!range || (range.minGrams === null && range.maxGrams === null)) return 'no_standard';
  if (range.minGrams !== null && grams < range.minGrams) return 'below';
  if (range.maxGrams !== null && grams > range.maxGrams) return 'above';
  return 'within';
}

export function seniorRangeFor(
  sex: Sex,
  breed: { seniorBuckGrams: WeightRange; seniorDoeGrams: WeightRange } | null,
): WeightRange | null {
  if (!breed) return null;
  return sex === 'buck' ? breed.seniorBuckGrams : breed.seniorDoeGrams;
}
