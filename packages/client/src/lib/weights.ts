import { formatWeight, GRAMS_PER_OUNCE, gramsToPounds, toFixedHalfUp, type WeightUnit } from '@burrowline/shared';

/** A weight in the farm's units ("4 lb 15.2 oz" or "2.24 kg"). */
export const weight = (grams: number, unit: WeightUnit) => formatWeight(grams, unit);

/** A daily gain in the farm's units: ounces a day for lb/oz farms (with grams beside), grams a day otherwise. */
export function gainPerDay(gramsPerDay: number | null, unit: WeightUnit): string {
  if (gramsPerDay === null) return '—';
  return unit === 'lb_oz' ? `${toFixedHalfUp(gramsPerDay / GRAMS_PER_OUNCE, 2)} oz/day (${toFixedHalfUp(gramsPerDay, 1)} g)` : `${toFixedHalfUp(gramsPerDay, 1)} g/day`;
}

/** Weight on a chart axis: pounds or kilograms. */
export const chartValue = (grams: number, unit: WeightUnit) => (unit === 'lb_oz' ? Math.round(gramsToPounds(grams) * 100) / 100 : Math.round(grams) / 1000);
export const chartUnit = (unit: WeightUnit) => (unit === 'lb_oz' ? 'lb' : 'kg');

