import { formatWeight, GRAMS_PER_OUNCE, toFixedHalfUp, type WeightUnit } from '@burrowline/shared';

/** Figures of the performance tables, as people read them; a missing figure is a dash. */
export const dash = '—';

export const percent = (x: number | null) => (x === null ? dash : `${(Math.round(x * 1000) / 10).toFixed(1)} %`);
export const decimal = (x: number | null, digits = 1) => (x === null ? dash : x.toFixed(digits));
export const wholeDays = (x: number | null) => (x === null ? dash : `${Math.round(x)} d`);
export const ratio = (x: number | null) => (x === null ? dash : x.toFixed(2));
export const weightOrDash = (grams: number | null, unit: WeightUnit) => (grams === null ? dash : formatWeight(grams, unit));

/** "n = 3" under a figure, so that a figure from one litter reads as one litter's. */
export const sampleWords = (n: number, noun: string) => `${n} ${noun}${n === 1 ? '' : 's'}`;

export const weightUnitShort = (unit: WeightUnit) => (unit === 'lb_oz' ? 'lb' : 'kg');

/** A daily gain, short enough for a table cell: ounces a day on lb/oz farms, grams a day otherwise. */
export const gainShort = (gramsPerDay: number | null, unit: WeightUnit) =>
  gramsPerDay === null ? dash : unit === 'lb_oz' ? `${toFixedHalfUp(gramsPerDay / GRAMS_PER_OUNCE, 2)} oz/day` : `${toFixedHalfUp(gramsPerDay, 1)} g/day`;
