import { fahrenheitToCelsius } from '../units/units';

/**
 * Heat: rabbits suffer above about 85 °F / 29 °C, heavily pregnant does and young litters most (brief,
 * "Where the work can hurt"; Texas Extension, TAMUK: trouble above ≈ 85 °F). Readings are stored in °C
 * to one decimal, so the line is 85 °F = 29.4 °C as stored. Only a reading of the last 24 hours counts.
 */
export const HEAT_CAUTION = Object.freeze({
  celsius: Math.round(fahrenheitToCelsius(85) * 10) / 10,
  fahrenheit: 85,
  withinHours: 24,
  source: 'Texas Extension (TAMUK): heat stress above about 85 °F',
});

/** What a barn can read; anything outside is a typing slip (or the wrong unit) and is refused. */
export const TEMPERATURE_LIMITS_CELSIUS = Object.freeze({ min: -40, max: 55 });

/** A reading in the unit it was taken in, to °C with one decimal (as stored). */
export function readingToCelsius(value: number, unit: 'F' | 'C'): number {
  const celsius = unit === 'F' ? fahrenheitToCelsius(value) : value;
  return Math.round(celsius * 10) / 10;
}

export function isHeatCaution(celsius: number): boolean {
  return celsius >= HEAT_CAUTION.celsius;
}

/** Kits younger than this are a "young litter" for the heat caution (common practice: before they leave the nest box). */
export const YOUNG_LITTER_DAYS = 21;
/** Does due to kindle within this many days are named on the heat caution (the last week of gestation). */
export const KINDLING_SOON_DAYS = 7;
