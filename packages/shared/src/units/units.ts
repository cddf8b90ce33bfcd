/** NIST Handbook 44, App. C: the international avoirdupois pound is exactly 0.45359237 kg. */
export const GRAMS_PER_POUND = 453.59237;
/** NIST Handbook 44: 1 oz = 1/16 lb = 28.349523125 g. */
export const GRAMS_PER_OUNCE = GRAMS_PER_POUND / 16;

export type WeightUnit = 'lb_oz' | 'kg_g';
export type TemperatureUnit = 'F' | 'C';

export function poundsToGrams(pounds: number): number {
  return pounds * GRAMS_PER_POUND;
}

export function gramsToPounds(grams: number): number {
  return grams / GRAMS_PER_POUND;
}

/**
 * A number with a fixed count of decimals, halves rounded away from zero as written in decimal.
 * `toFixed` rounds the binary double, so 1.015 (stored as 1.01499…) would show as "1.01".
 */
export function toFixedHalfUp(value: number, decimals: number): string {
  const factor = 10 ** decimals;
  // Twelve significant digits drop the binary tail (101.49999999999999 becomes 101.5) before rounding.
  const scaled = Math.round(Number((Math.abs(value) * factor).toPrecision(12)));
  const sign = value < 0 && scaled > 0 ? '-' : '';
  return `${sign}${(scaled / factor).toFixed(decimals)}`;
}

/** Splits grams into whole pounds and ounces (rounded to a tenth of an ounce, from whole grams). */
export function gramsToPoundsOunces(grams: number): { pounds: number; ounces: number } {
  const totalOunces = Math.round((Math.round(grams) / GRAMS_PER_OUNCE) * 10) / 10;
  const pounds = Math.floor(totalOunces / 16);
  const ounces = Math.round((totalOunces - pounds * 16) * 10) / 10;
  return { pounds, ounces };
}

export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}

export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}

/**
 * Formats a stored weight in the farm's chosen units, e.g. "5 lb 2.3 oz" or "2.32 kg". From 10 lb up
 * (feed sacks, stock, a batch) ounces are whole: a tenth of an ounce there is noise from the gram.
 */
export function formatWeight(grams: number, unit: WeightUnit): string {
  const wholeGrams = Math.round(grams);
  if (unit === 'kg_g') {
    if (wholeGrams < 1000) return `${wholeGrams} g`;
    // Hundredths of a kilogram from whole grams in integers: 1,015 g is 1.02 kg, not toFixed's 1.01.
    const hundredths = Math.floor((wholeGrams + 5) / 10);
    return `${Math.floor(hundredths / 100)}.${String(hundredths % 100).padStart(2, '0')} kg`;
  }
  if (wholeGrams >= 10 * GRAMS_PER_POUND) {
    const wholeOunces = Math.round(wholeGrams / GRAMS_PER_OUNCE);
    return `${Math.floor(wholeOunces / 16)} lb ${wholeOunces % 16} oz`;
  }
  const { pounds, ounces } = gramsToPoundsOunces(wholeGrams);
  return pounds > 0 ? `${pounds} lb ${ounces} oz` : `${ounces} oz`;
}

export function formatTemperature(celsius: number, unit: TemperatureUnit): string {
  return unit === 'C' ? `${toFixedHalfUp(celsius, 1)} °C` : `${toFixedHalfUp(celsiusToFahrenheit(celsius), 1)} °F`;
}

/**
 * A weight typed in the farm's units to whole grams: pounds and ounces, or kilograms and grams (either
 * part may be blank). null when nothing usable was typed or a part is negative.
 */
export function weightInputToGrams(major: string, minor: string, unit: WeightUnit): number | null {
  const read = (text: string) => (text.trim() === '' ? 0 : Number(text.trim().replace(',', '.')));
  const a = read(major);
  const b = read(minor);
  if (!Number.isFinite(a) || !Number.isFinite(b) || a < 0 || b < 0) return null;
  const grams = unit === 'lb_oz' ? a * GRAMS_PER_POUND + b * GRAMS_PER_OUNCE : a * 1000 + b;
  return grams > 0 ? Math.round(grams) : null;
}

/**
 * Stored grams back into the two boxes of a weight field (to correct an entry): kilograms and grams, or
 * pounds and the fewest decimals of ounces that give the same whole grams back (0.005 oz is 0.14 g, so two
 * decimals always do). A zero second box is left empty.
 */
export function gramsToWeightInput(grams: number, unit: WeightUnit): { major: string; minor: string } {
  const boxes = (major: number, minor: number) => ({ major: String(major), minor: minor === 0 ? '' : String(minor) });
  if (unit === 'kg_g') return boxes(Math.floor(grams / 1000), Math.round(grams % 1000));
  for (const decimals of [0, 1, 2]) {
    const scale = 10 ** decimals;
    const ounces = Math.round((grams / GRAMS_PER_OUNCE) * scale);
    const form = boxes(Math.floor(ounces / (16 * scale)), (ounces % (16 * scale)) / scale);
    if (decimals === 2 || weightInputToGrams(form.major, form.minor, unit) === grams) return form;
  }
  throw new Error('unreachable');
}
