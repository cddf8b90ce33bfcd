import { addMonths, daysBetween } from '../herd/herd-dates';
import { poundsToGrams } from '../units/units';

/**
 * USDA FSIS, "Rabbit from Farm to Table":
 * - fryer or young rabbit: a carcass of not less than 1½ lb and rarely more than 3½ lb, from a rabbit
 *   usually under 12 weeks of age;
 * - roaster or mature rabbit: a carcass of any weight, but usually over 4 lb, from a rabbit usually over
 *   8 months of age.
 * What the two definitions leave between them (12 weeks to 8 months, or a young carcass under 1½ lb) is
 * 'unclassed'. The "rarely" and "usually" weights do not decide the class; they raise a note.
 * Pounds are converted with NIST Handbook 44 (1 lb = 453.59237 g).
 */
export const USDA_CLASS_LIMITS = Object.freeze({
  fryerMinCarcassGrams: poundsToGrams(1.5),
  fryerUsualMaxCarcassGrams: poundsToGrams(3.5),
  fryerMaxAgeDays: 12 * 7,
  roasterUsualMinCarcassGrams: poundsToGrams(4),
  roasterMinAgeMonths: 8,
  source: 'USDA FSIS, "Rabbit from Farm to Table"',
});

export type UsdaClass = 'fryer' | 'roaster' | 'unclassed';

export interface UsdaClassResult {
  usdaClass: UsdaClass;
  ageDays: number | null;
  reason: string;
  /** A weight the definition calls rare or unusual for the class. */
  note: string | null;
}

/**
 * The class of a carcass (the chilled weight when there is one: the class describes the ready-to-cook
 * carcass) from the animal's birth date and the processing date.
 */
export function usdaClass(input: { birthDate: string | null; processedOn: string; carcassGrams: number }): UsdaClassResult {
  const { carcassGrams } = input;
  if (!(Number.isFinite(carcassGrams) && carcassGrams > 0)) throw new RangeError('The carcass weight must be above zero');
  if (!input.birthDate) return { usdaClass: 'unclassed', ageDays: null, reason: 'Age unknown: the classes are defined by age', note: null };
  const ageDays = daysBetween(input.birthDate, input.processedOn);
  if (ageDays < 0) throw new RangeError('Processed before the birth date');
  const L = USDA_CLASS_LIMITS;
  if (ageDays < L.fryerMaxAgeDays) {
    if (carcassGrams < L.fryerMinCarcassGrams) {
      return { usdaClass: 'unclassed', ageDays, reason: 'Under 12 weeks but the carcass is under 1½ lb, the fryer minimum', note: null };
    }
    return {
      usdaClass: 'fryer', ageDays, reason: 'Under 12 weeks with a carcass of at least 1½ lb',
      note: carcassGrams > L.fryerUsualMaxCarcassGrams ? 'Heavier than 3½ lb, which a fryer rarely is' : null,
    };
  }
  if (input.processedOn > addMonths(input.birthDate, L.roasterMinAgeMonths)) {
    return {
      usdaClass: 'roaster', ageDays, reason: 'Over 8 months of age',
      note: carcassGrams <= L.roasterUsualMinCarcassGrams ? 'Not over 4 lb, which a roaster usually is' : null,
    };
  }
  return { usdaClass: 'unclassed', ageDays, reason: 'Between 12 weeks and 8 months: neither a fryer nor a roaster by the USDA definitions', note: null };
}
