import type { TemperatureUnit, WeightUnit } from '@burrowline/shared';

export const weightUnitLabels: Record<WeightUnit, string> = {
  lb_oz: 'Pounds and ounces',
  kg_g: 'Kilograms and grams',
};

export const temperatureUnitLabels: Record<TemperatureUnit, string> = {
  F: '°F',
  C: '°C',
};

/** For the picker: "America/New_York" → "America/New York"; the stored value stays the IANA name. */
export function timeZoneLabel(timeZone: string): string {
  return timeZone.replaceAll('_', ' ');
}
