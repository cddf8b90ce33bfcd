import { addDays, daysBetween, isIsoDate } from '../herd/herd-dates';

/**
 * Average daily gain. A weigh-in is a group's total grams over its head count (a whole litter on the
 * scale, or a pen), or one animal (head count 1); gain is always worked per head, so a kit that dies
 * between weigh-ins does not read as a loss of weight.
 */
export interface WeighInPoint {
  weighedOn: string;
  totalGrams: number;
  headCount: number;
}

/** Rao et al. 1977, J. Anim. Sci. 44:1021: birth to 8 weeks. */
export const PUBLISHED_GAIN = Object.freeze({
  gramsPerDay: 28.8,
  fromAgeDays: 0,
  toAgeDays: 56,
  eightWeekGrams: 1644,
  eightWeekSdGrams: 359,
  source: 'Rao et al. 1977, J. Anim. Sci. 44:1021 (birth to 8 weeks; 8-week weight 1,644 ± 359 g)',
});

export function gramsPerHead(w: WeighInPoint): number {
  return w.totalGrams / w.headCount;
}

export function checkWeighInPoint(w: WeighInPoint): void {
  if (!isIsoDate(w.weighedOn)) throw new RangeError(`Not a YYYY-MM-DD date: ${w.weighedOn}`);
  if (!Number.isFinite(w.totalGrams) || w.totalGrams <= 0) throw new RangeError('A weigh-in needs a weight above zero');
  if (!Number.isInteger(w.headCount) || w.headCount < 1) throw new RangeError('A weigh-in needs a head count of at least 1');
}

/** Weigh-ins checked and in date order (a copy). */
export function sortedWeighIns(weighIns: ReadonlyArray<WeighInPoint>): WeighInPoint[] {
  weighIns.forEach(checkWeighInPoint);
  return [...weighIns].sort((a, b) => (a.weighedOn < b.weighedOn ? -1 : a.weighedOn > b.weighedOn ? 1 : 0));
}

/** Grams a day per head between two weigh-ins; null when they are on the same day. */
export function averageDailyGain(from: WeighInPoint, to: WeighInPoint): number | null {
  checkWeighInPoint(from);
  checkWeighInPoint(to);
  const days = daysBetween(from.weighedOn, to.weighedOn);
  if (days === 0) return null;
  return (gramsPerHead(to) - gramsPerHead(from)) / days;
}

export interface GainSummary {
  /** Per head, first to last weigh-in; null with fewer than two weigh-in days. */
  gramsPerDay: number | null;
  days: number;
  fromOn: string | null;
  toOn: string | null;
  /** Gain in each interval between consecutive weigh-ins. */
  periods: { fromOn: string; toOn: string; days: number; gramsPerDay: number }[];
}

/**
 * ADG of a grow-out group (or of one animal: head count 1), first to last weigh-in, with the gain of each
 * period between weigh-ins. Several weigh-ins on one day are averaged per head.
 */
export function gainSummary(weighIns: ReadonlyArray<WeighInPoint>): GainSummary {
  // In date order, so one day's weigh-ins are next to each other.
  const totals: { on: string; grams: number; heads: number }[] = [];
  for (const w of sortedWeighIns(weighIns)) {
    const day = totals[totals.length - 1];
    if (day && day.on === w.weighedOn) {
      day.grams += w.totalGrams;
      day.heads += w.headCount;
    } else {
      totals.push({ on: w.weighedOn, grams: w.totalGrams, heads: w.headCount });
    }
  }
  const days = totals.map((d) => ({ on: d.on, perHead: d.grams / d.heads }));
  const periods: GainSummary['periods'] = [];
  for (let i = 1; i < days.length; i++) {
    const a = days[i - 1]!;
    const b = days[i]!;
    const span = daysBetween(a.on, b.on);
    periods.push({ fromOn: a.on, toOn: b.on, days: span, gramsPerDay: (b.perHead - a.perHead) / span });
  }
  if (days.length < 2) return { gramsPerDay: null, days: 0, fromOn: days[0]?.on ?? null, toOn: days[0]?.on ?? null, periods };
  const first = days[0]!;
  const last = days[days.length - 1]!;
  const span = daysBetween(first.on, last.on);
  return { gramsPerDay: (last.perHead - first.perHead) / span, days: span, fromOn: first.on, toOn: last.on, periods };
}

/** ADG from birth: (weight per head − birth weight per head) ÷ age in days. */
export function gainFromBirth(birthDate: string, birthGramsPerHead: number, weighIn: WeighInPoint): number {
  checkWeighInPoint(weighIn);
  if (!Number.isFinite(birthGramsPerHead) || birthGramsPerHead < 0) throw new RangeError('Birth weight must be 0 or more grams');
  const age = daysBetween(birthDate, weighIn.weighedOn);
  if (age <= 0) throw new RangeError('The weigh-in must come after the birth date');
  return (gramsPerHead(weighIn) - birthGramsPerHead) / age;
}

export interface GainComparison {
  gramsPerDay: number;
  publishedGramsPerDay: number;
  /** (ours − published) ÷ published × 100. */
  differencePercent: number;
  source: string;
}

/** A gain against the published 28.8 g/day birth → 8 weeks (Rao et al. 1977). */
export function againstPublishedGain(gramsPerDay: number): GainComparison {
  return {
    gramsPerDay,
    publishedGramsPerDay: PUBLISHED_GAIN.gramsPerDay,
    differencePercent: ((gramsPerDay - PUBLISHED_GAIN.gramsPerDay) / PUBLISHED_GAIN.gramsPerDay) * 100,
    source: PUBLISHED_GAIN.source,
  };
}

/** An 8-week weight in standard deviations from the published mean (1,644 ± 359 g, Rao et al. 1977). */
export function eightWeekWeightZ(grams: number): number {
  return (grams - PUBLISHED_GAIN.eightWeekGrams) / PUBLISHED_GAIN.eightWeekSdGrams;
}

/**
 * The birth date of a group made of kits from several litters: the head-weighted mean of the kindling
 * dates, to the nearest day (ages in a group spread by a few days at most).
 */
export function groupBirthDate(litters: ReadonlyArray<{ kindledOn: string; heads: number }>): string {
  const heads = litters.reduce((n, l) => n + l.heads, 0);
  if (litters.length === 0 || heads <= 0) throw new RangeError('A group needs at least one kit from a litter');
  const anchor = litters[0]!.kindledOn;
  const meanOffset = litters.reduce((sum, l) => sum + daysBetween(anchor, l.kindledOn) * l.heads, 0) / heads;
  return addDays(anchor, Math.round(meanOffset));
}

/**
 * The co-op's average weight per head at each of the given ages, from many groups' weigh-ins (each
 * weigh-in counts by its heads; a weigh-in counts for an age when within `toleranceDays` of it). For the
 * growth chart's comparison line.
 */
export function averageWeightByAge(
  weighIns: ReadonlyArray<{ ageDays: number; totalGrams: number; headCount: number }>,
  ages: ReadonlyArray<number>,
  toleranceDays = 3,
): { ageDays: number; gramsPerHead: number | null; heads: number; weighIns: number }[] {
  return ages.map((age) => {
    let grams = 0;
    let heads = 0;
    let count = 0;
    for (const w of weighIns) {
      if (Math.abs(w.ageDays - age) > toleranceDays || w.headCount < 1) continue;
      grams += w.totalGrams;
      heads += w.headCount;
      count++;
    }
    return { ageDays: age, gramsPerHead: heads > 0 ? grams / heads : null, heads, weighIns: count };
  });
}
