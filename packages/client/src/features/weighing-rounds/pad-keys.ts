import { weightInputToGrams, type WeightUnit } from '@burrowline/shared';

/** The boxes a weight is typed into on the pad: pounds and ounces, or grams alone (whole grams on a phone's scale). */
export type PadBox = 'major' | 'minor';
export interface PadValue { major: string; minor: string }

export const emptyPad: PadValue = { major: '', minor: '' };

/** The first box a new weight starts in: pounds for lb/oz farms, grams for metric ones. */
export const firstBox = (unit: WeightUnit): PadBox => (unit === 'lb_oz' ? 'major' : 'minor');

/**
 * One key of the pad on a box's text: a digit, the decimal point (ounces only; pounds and grams are
 * whole on the pad) or ⌫. Five digits at most: no rabbit needs more.
 */
export function pressKey(text: string, key: string, allowDecimal: boolean): string {
  if (key === '⌫') return text.slice(0, -1);
  if (key === '.') return !allowDecimal || text.includes('.') ? text : `${text === '' ? '0' : text}.`;
  if (!/^\d$/.test(key)) return text;
  if (text.replace('.', '').length >= 5) return text;
  if (text.includes('.') && text.split('.')[1]!.length >= 1) return text;
  return text === '0' ? key : text + key;
}

/** Whole grams of what the pad shows, through the shared conversion (1 lb = 453.59237 g); null when empty. */
export function padGrams(value: PadValue, unit: WeightUnit): number | null {
  return unit === 'lb_oz' ? weightInputToGrams(value.major, value.minor, unit) : weightInputToGrams('', value.minor, unit);
}
