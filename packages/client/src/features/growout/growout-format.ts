import { formatWeight, GRAMS_PER_OUNCE, gramsToPounds, toFixedHalfUp, type Readiness, type WeightUnit } from '@burrowline/shared';
import { useSession } from '../../lib/session';

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

/** Money in the co-op's currency, from integer cents. */
export function useMoney(): (cents: number | null) => string {
  const { coop } = useSession();
  const format = new Intl.NumberFormat('en-US', { style: 'currency', currency: coop.currency || 'USD' });
  return (cents) => (cents === null ? '—' : format.format(cents / 100));
}

export const readinessTone: Record<Readiness, 'moss' | 'straw' | 'clay' | 'neutral'> = {
  reached: 'moss', ready: 'moss', likely: 'straw', possible: 'straw', not_ready: 'clay', unknown: 'neutral',
};
