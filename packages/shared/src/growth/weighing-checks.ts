import type { SizeClass } from '../herd/herd-enums';
import { daysBetween } from '../herd/herd-dates';
import { gompertzWeight, referenceCurve } from './gompertz';
import { checkWeightForAge } from './plausibility';

/** The usual weight for an age and the band around it that passes without a question (checkWeightForAge's 0.6–1.6). */
export interface WeightBand {
  lowGrams: number;
  expectedGrams: number;
  highGrams: number;
}

export const BAND_LOW_FACTOR = 0.6;
export const BAND_HIGH_FACTOR = 1.6;

export function expectedBandForAge(ageDays: number | null, sizeClass: SizeClass = 'medium'): WeightBand | null {
  if (ageDays === null || ageDays < 0) return null;
  const expected = gompertzWeight(ageDays, referenceCurve(sizeClass));
  return { lowGrams: Math.round(expected * BAND_LOW_FACTOR), expectedGrams: Math.round(expected), highGrams: Math.round(expected * BAND_HIGH_FACTOR) };
}

/** A weight per head on a day, with the age it was at when known. */
export interface DatedWeight {
  gramsPerHead: number;
  weighedOn: string;
  ageDays: number | null;
}

/**
 * The last weight carried forward to a later day along the reference curve's shape (a kit at 40 days
 * grows by the curve's ratio between the two ages); an animal of unknown age is assumed to hold its weight.
 */
export function projectWeight(last: DatedWeight, on: string, sizeClass: SizeClass = 'medium'): number {
  if (last.ageDays === null) return last.gramsPerHead;
  const curve = referenceCurve(sizeClass);
  const later = last.ageDays + Math.max(daysBetween(last.weighedOn, on), 0);
  return last.gramsPerHead * (gompertzWeight(later, curve) / gompertzWeight(last.ageDays, curve));
}

/**
 * A loss since the last weigh-in worth a second look: a growing or adult rabbit seldom loses a tenth of
 * its weight between weighings without an illness or a misread scale (common practice).
 */
export const DROP_WARNING_FRACTION = 0.1;

export interface EntryCheck {
  level: 'error' | 'warning';
  message: string;
}

/**
 * One weight of a weighing round: impossible for the age (checkWeightForAge's error) refuses it; outside
 * the usual band for the age, or a tenth or more below the last weigh-in, asks to confirm.
 */
export function checkRoundWeight(input: {
  gramsPerHead: number; ageDays: number | null; sizeClass?: SizeClass; last: DatedWeight | null; weighedOn: string;
}): EntryCheck | null {
  const age = checkWeightForAge(input.gramsPerHead, input.ageDays, input.sizeClass ?? 'medium');
  if (age?.level === 'error') return { level: 'error', message: age.message };
  if (input.last && input.last.weighedOn <= input.weighedOn && input.gramsPerHead < input.last.gramsPerHead * (1 - DROP_WARNING_FRACTION)) {
    const lost = Math.round(input.last.gramsPerHead - input.gramsPerHead);
    return { level: 'warning', message: `${Math.round(input.gramsPerHead)} g is ${lost} g less than on ${input.last.weighedOn} (${Math.round(input.last.gramsPerHead)} g)` };
  }
  if (age) return { level: 'warning', message: age.message };
  return null;
}

/**
 * How far a processed live weight per head may sit from the last weigh-in carried forward before it is
 * questioned: a quarter lighter or a third heavier (common practice: fasting and gut fill move a fryer's
 * weight by a few percent, not a quarter).
 */
export const LIVE_WEIGHT_LOW_FACTOR = 0.75;
export const LIVE_WEIGHT_HIGH_FACTOR = 4 / 3;

/** A processed live weight against the last weigh-in projected to the processing day; null when it fits or nothing was weighed. */
export function checkLiveWeightAgainstLast(input: {
  liveGramsPerHead: number; processedOn: string; last: DatedWeight | null; sizeClass?: SizeClass;
}): { message: string; projectedGrams: number } | null {
  if (!input.last || input.last.weighedOn > input.processedOn) return null;
  const projected = projectWeight(input.last, input.processedOn, input.sizeClass ?? 'medium');
  const ratio = input.liveGramsPerHead / projected;
  if (ratio >= LIVE_WEIGHT_LOW_FACTOR && ratio <= LIVE_WEIGHT_HIGH_FACTOR) return null;
  const days = daysBetween(input.last.weighedOn, input.processedOn);
  return {
    projectedGrams: Math.round(projected),
    message: `${Math.round(input.liveGramsPerHead)} g a head is far ${ratio < 1 ? 'below' : 'above'} the last weigh-in (${Math.round(input.last.gramsPerHead)} g on ${input.last.weighedOn}, about ${Math.round(projected)} g ${days} days on); check the weight and the head count`,
  };
}
