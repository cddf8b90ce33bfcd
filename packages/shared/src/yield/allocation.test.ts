import { describe, expect, it } from 'vitest';
import { seededRandom, randomInt } from '../pedigree/seeded-random';
import { allocateByHeadDays, headDays, largestRemainder } from './allocation';

describe('largest-remainder allocation', () => {
  it('when random amounts are split over random shares (seeded), then the parts always add up and each is within 1 of its quota', () => {
    const random = seededRandom(42);
    for (let round = 0; round < 500; round++) {
      const total = randomInt(random, 0, 2_000_000);
      const weights: number[] = Array.from({ length: randomInt(random, 1, 9) }, () => randomInt(random, 0, 5000));
      if (!weights.some((w) => w > 0)) weights[0] = 1;
      const parts = largestRemainder(total, weights);
      const sum = weights.reduce((s, w) => s + w, 0);
      expect(parts.reduce((s, p) => s + p, 0)).toBe(total);
      parts.forEach((p, i) => {
        const quota = (total * weights[i]!) / sum;
        expect(Math.abs(p - quota)).toBeLessThan(1);
        if (weights[i] === 0) expect(p).toBe(0);
      });
    }
  });

  it('when amounts are huge, then the integer arithmetic stays exact', () => {
    const parts = largestRemainder(9_007_199_254_740_991, [1, 1, 1]);
    expect(parts.reduce((s, p) => s + p, 0)).toBe(9_007_199_254_740_991);
  });

  it('when remainders tie, then the larger share gets the unit, then the earlier', () => {
    expect(largestRemainder(1, [1, 3])).toEqual([0, 1]);
    expect(largestRemainder(2, [1, 1, 1, 1])).toEqual([1, 1, 0, 0]);
  });

  it('when the input is bad, then it is refused with a clear message', () => {
    expect(() => largestRemainder(-1, [1])).toThrow('The amount to split must be a whole number, 0 or more');
    expect(() => largestRemainder(10.5, [1])).toThrow(RangeError);
    expect(() => largestRemainder(10, [])).toThrow('Nothing to split the amount between');
    expect(() => largestRemainder(10, [1, -1])).toThrow('Each share must be a whole number, 0 or more');
    expect(() => largestRemainder(10, [0, 0])).toThrow('All shares are zero: nothing to split the amount by');
    expect(largestRemainder(0, [0, 0])).toEqual([0, 0]);
  });
});

describe('head-days', () => {
  it('when a group of 8 loses one on the 4th day of a week, then it counts 3 × 8 + 4 × 7 = 52 head-days', () => {
    expect(headDays('2026-05-01', '2026-05-07', [{ on: '2026-04-20', heads: 8 }, { on: '2026-05-04', heads: 7 }])).toBe(52);
  });

  it('when a group arrives mid-period, then the days before count no heads', () => {
    expect(headDays('2026-05-01', '2026-05-07', [{ on: '2026-05-06', heads: 5 }])).toBe(10);
  });

  it('when head-days feed an allocation, then the parts follow them', () => {
    const hd = headDays('2026-05-01', '2026-05-07', [{ on: '2026-05-01', heads: 6 }]);
    expect(allocateByHeadDays(9000, [{ id: 'a', headDays: hd }, { id: 'b', headDays: 2 * hd }])).toEqual([{ id: 'a', grams: 3000 }, { id: 'b', grams: 6000 }]);
  });

  it('when the period is backwards or a count negative, then it is refused', () => {
    expect(() => headDays('2026-05-07', '2026-05-01', [])).toThrow(RangeError);
    expect(() => headDays('2026-05-01', '2026-05-07', [{ on: '2026-05-01', heads: -1 }])).toThrow(RangeError);
  });
});
