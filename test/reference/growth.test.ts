import { describe, expect, it } from 'vitest';
import {
  addDays, againstPublishedGain, daysBetween, eightWeekWeightZ, gainFromBirth, gainSummary, gompertzAgeAt, gompertzWeight,
  projectTargetDate, PUBLISHED_GAIN, REFERENCE_MEDIUM_CURVE, type GompertzParams, type WeighInPoint,
} from '@burrowline/shared';
import { seededRandom } from '../../packages/shared/src/pedigree/seeded-random';

/** A standard normal draw from the seeded generator (Box–Muller). */
function normal(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

const birth = '2026-03-01';
const ageOf = (date: string) => daysBetween(birth, date);

/** Weigh-ins of a litter of `heads` on a known Gompertz curve with multiplicative noise (constructed). */
function series(curve: GompertzParams, ages: number[], noise: number, seed: number, heads = 8): WeighInPoint[] {
  const random = seededRandom(seed);
  return ages.map((age) => ({
    weighedOn: addDays(birth, age),
    totalGrams: Math.round(gompertzWeight(age, curve) * Math.exp(noise * normal(random)) * heads),
    headCount: heads,
  }));
}

describe('average daily gain against Rao et al. 1977, J. Anim. Sci. 44:1021 (28.8 g/day birth → 8 weeks; 8-week weight 1,644 ± 359 g)', () => {
  it('when a kit weighs 1,644 g at 56 days, then from the birth weight the published figures imply (31.2 g, derived) the gain is 28.8 g a day', () => {
    const birthGrams = PUBLISHED_GAIN.eightWeekGrams - PUBLISHED_GAIN.gramsPerDay * 56; // derived: 1,644 − 28.8 × 56
    expect(birthGrams).toBeCloseTo(31.2, 9);
    const adg = gainFromBirth(birth, birthGrams, { weighedOn: addDays(birth, 56), totalGrams: 1644, headCount: 1 });
    expect(adg).toBeCloseTo(28.8, 9);
    expect(againstPublishedGain(adg).differencePercent).toBeCloseTo(0, 9);
  });

  it('when the birth weight is the usual 50–60 g of a medium-breed kit (common practice: no published figure on record), then the gain to 1,644 g is within 0.6 g/day of 28.8', () => {
    for (const birthGrams of [50, 55, 60]) {
      const adg = gainFromBirth(birth, birthGrams, { weighedOn: addDays(birth, 56), totalGrams: 1644 * 8, headCount: 8 });
      expect(Math.abs(adg - PUBLISHED_GAIN.gramsPerDay)).toBeLessThan(0.6);
    }
  });

  it('when a litter is weighed whole at birth and at 8 weeks, then the group gain per head is the same as one kit\'s', () => {
    const litter = gainSummary([
      { weighedOn: birth, totalGrams: 8 * 31.2, headCount: 8 },
      { weighedOn: addDays(birth, 56), totalGrams: 7 * 1644, headCount: 7 }, // one kit lost: gain stays per head
    ]);
    expect(litter.gramsPerDay).toBeCloseTo(28.8, 9);
    expect(litter.days).toBe(56);
  });

  it('when an 8-week weight is one published standard deviation light (1,285 g), then its z-score is −1', () => {
    expect(eightWeekWeightZ(1644 - 359)).toBeCloseTo(-1, 12);
  });

  it('when the reference curve is read at 8 weeks, then it gives the published 1,644 g (derived: A = 10 lb from the ARBA senior weights, W(0) = 55 g common practice)', () => {
    expect(gompertzWeight(56, REFERENCE_MEDIUM_CURVE)).toBeCloseTo(1644, 6);
    // A = 10 lb, the middle of the New Zealand (bucks 9–11, does 10–12 lb) and Californian (bucks 8–10, does 8.5–10.5 lb)
    // senior ranges of the ARBA Standard of Perfection, as quoted second-hand; = 4,535.9237 g (NIST Handbook 44: 1 lb = 453.59237 g).
    expect(REFERENCE_MEDIUM_CURVE.matureGrams).toBe(4536);
  });
});

describe('projected date to the target live weight (2,270 g ≈ 5 lb, common practice; Oregon State Ext. Bulletin 745: 4–5 lb at 8 weeks)', () => {
  // Constructed truth: a medium meat-breed curve near the reference one (A 4,800 g, b 4.3, k 0.028/day).
  const truth: GompertzParams = { matureGrams: 4800, b: 4.3, k: 0.028 };
  const trueDay = Math.ceil(gompertzAgeAt(2270, truth)!); // 62.4 → day 63

  it('when a litter is weighed weekly from 4 to 8 weeks on a known Gompertz curve with 4 % noise (seeded), then the fitted curve\'s date interval holds the true date', () => {
    const projection = projectTargetDate({ birthDate: birth, weighIns: series(truth, [28, 35, 42, 49, 56], 0.04, 20260301), targetGrams: 2270 });
    expect(projection.status).toBe('projected');
    expect(projection.model.kind).toBe('gompertz');
    expect(projection.model.description).toMatch(/^Gompertz growth curve W\(t\) = A·exp\(−b·exp\(−k·t\)\) fitted to 5 weigh-ins/);
    const { from, to } = projection.interval!;
    expect(ageOf(from)).toBeLessThanOrEqual(trueDay);
    expect(ageOf(to)).toBeGreaterThanOrEqual(trueDay);
    expect(Math.abs(ageOf(projection.projectedOn!) - trueDay)).toBeLessThanOrEqual(3);
  });

  it('when the same is repeated over 200 seeds, then the 90 % interval holds the true date at least 85 % of the time', () => {
    let held = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const p = projectTargetDate({ birthDate: birth, weighIns: series(truth, [28, 35, 42, 49, 56], 0.04, seed), targetGrams: 2270 });
      if (p.interval && ageOf(p.interval.from) <= trueDay && ageOf(p.interval.to) >= trueDay) held++;
    }
    expect(held / 200).toBeGreaterThanOrEqual(0.85);
  });

  it('when the weigh-ins are the farm\'s default ages 28, 42 and 56 days (three points), then the curve is still fitted, with a wider interval', () => {
    const three = projectTargetDate({ birthDate: birth, weighIns: series(truth, [28, 42, 56], 0.04, 7), targetGrams: 2270 });
    const five = projectTargetDate({ birthDate: birth, weighIns: series(truth, [28, 35, 42, 49, 56], 0.04, 7), targetGrams: 2270 });
    expect(three.model.kind).toBe('gompertz');
    const width = (p: typeof three) => daysBetween(p.interval!.from, p.interval!.to);
    expect(width(three)).toBeGreaterThanOrEqual(width(five));
    expect(ageOf(three.interval!.from)).toBeLessThanOrEqual(trueDay);
    expect(ageOf(three.interval!.to)).toBeGreaterThanOrEqual(trueDay);
  });

  // Constructed from published anchors, not measured: weekly weights read off the reference curve (10 lb mature
  // weight, breed standards; 1,644 g at 8 weeks, Rao et al. 1977) and rounded to 10 g as a farm scale would.
  it('when weekly weights of the published-like series (constructed) are given to 8 weeks, then the projection meets the curve\'s own 2,270 g day (71)', () => {
    const weekly = [21, 28, 35, 42, 49, 56].map((age) => ({
      weighedOn: addDays(birth, age), totalGrams: Math.round(gompertzWeight(age, REFERENCE_MEDIUM_CURVE) / 10) * 10, headCount: 1,
    }));
    expect(weekly.map((w) => w.totalGrams)).toEqual([360, 550, 780, 1050, 1340, 1640]); // weeks 3–8
    const curveDay = Math.ceil(gompertzAgeAt(2270, REFERENCE_MEDIUM_CURVE)!);
    const p = projectTargetDate({ birthDate: birth, weighIns: weekly, targetGrams: 2270 });
    expect(curveDay).toBe(71);
    expect(p.model.kind).toBe('gompertz');
    expect(Math.abs(ageOf(p.projectedOn!) - curveDay)).toBeLessThanOrEqual(1);
    expect(ageOf(p.interval!.from)).toBeLessThanOrEqual(curveDay);
    expect(ageOf(p.interval!.to)).toBeGreaterThanOrEqual(curveDay);
    // and the fitted curve gives back the published 8-week weight within 2 %
    expect(gompertzWeight(56, p.model.gompertz!) / 1644).toBeCloseTo(1, 1);
  });

  it('when there are only two weigh-ins (600 g at 28 d, 1,100 g at 42 d, constructed), then the stated straight line gives day 75 (worked by hand: 42 + 1,170 ÷ 35.71)', () => {
    const p = projectTargetDate({
      birthDate: birth, targetGrams: 2270,
      weighIns: [{ weighedOn: addDays(birth, 28), totalGrams: 4800, headCount: 8 }, { weighedOn: addDays(birth, 42), totalGrams: 8800, headCount: 8 }],
    });
    expect(p.model.kind).toBe('linear_two_point');
    expect(p.model.description).toMatch(/^Straight line through two weigh-ins \(35\.7 g a day\)/);
    expect(p.projectedAgeDays).toBeCloseTo(42 + 1170 / (500 / 14), 9);
    expect(p.projectedOn).toBe('2026-05-15'); // 1 March + 75 days
    expect(p.interval!.from <= p.projectedOn! && p.projectedOn! <= p.interval!.to).toBe(true);
  });
});
