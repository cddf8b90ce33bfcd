import type { SizeClass } from '../herd/herd-enums';
import { gompertzWeight, referenceCurve } from './gompertz';

export interface WeightCheck {
  level: 'error' | 'warning';
  code: 'not_positive' | 'absurd' | 'unusual';
  message: string;
  /** The reference weight for the age (REFERENCE_MEDIUM_CURVE scaled to the breed size). */
  expectedGrams: number | null;
}

/** No rabbit weighs more (the heaviest giants reach about half of this). */
export const MAX_RABBIT_GRAMS = 20_000;

/**
 * Whether a weight per head is possible for the age: refused (an error) below a quarter or above three
 * times the reference curve's weight for that age, questioned (a warning) outside 0.6–1.6 times — about
 * two standard deviations of the published 8-week weight (1,644 ± 359 g, Rao et al. 1977) either side.
 * Without an age only the absolute limits apply.
 */
export function checkWeightForAge(
  gramsPerHead: number, ageDays: number | null, sizeClass: SizeClass = 'medium', matureGrams?: number | null,
): WeightCheck | null {
  if (!Number.isFinite(gramsPerHead) || gramsPerHead <= 0) {
    return { level: 'error', code: 'not_positive', message: 'A weight must be above zero', expectedGrams: null };
  }
  if (gramsPerHead > MAX_RABBIT_GRAMS) {
    return { level: 'error', code: 'absurd', message: `${Math.round(gramsPerHead)} g a head is more than any rabbit weighs; check the weight and the head count`, expectedGrams: null };
  }
  if (ageDays === null) return null;
  const expected = Math.round(gompertzWeight(ageDays, referenceCurve(sizeClass, matureGrams)));
  const ratio = gramsPerHead / expected;
  const at = `at ${ageDays} days (about ${expected} g is usual)`;
  if (ratio < 0.25 || ratio > 3) {
    return { level: 'error', code: 'absurd', message: `${Math.round(gramsPerHead)} g a head is not possible ${at}; check the weight, the head count and the date`, expectedGrams: expected };
  }
  if (ratio < 0.6 || ratio > 1.6) {
    return { level: 'warning', code: 'unusual', message: `${Math.round(gramsPerHead)} g a head is ${ratio < 1 ? 'light' : 'heavy'} ${at}`, expectedGrams: expected };
  }
  return null;
}
