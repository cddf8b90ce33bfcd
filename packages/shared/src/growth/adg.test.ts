import { describe, expect, it } from 'vitest';
import { averageDailyGain, averageWeightByAge, gainFromBirth, gainSummary, groupBirthDate } from './adg';
import { checkWeightForAge } from './plausibility';

describe('average daily gain', () => {
  it('when a group is weighed three times, then the gain is first to last per head, with each period', () => {
    const summary = gainSummary([
      { weighedOn: '2026-05-27', totalGrams: 7 * 1600, headCount: 7 },
      { weighedOn: '2026-04-29', totalGrams: 8 * 600, headCount: 8 },
      { weighedOn: '2026-05-13', totalGrams: 8 * 1100, headCount: 8 },
    ]);
    expect(summary).toMatchObject({ gramsPerDay: 1000 / 28, days: 28, fromOn: '2026-04-29', toOn: '2026-05-27' });
    expect(summary.periods.map((p) => p.gramsPerDay)).toEqual([500 / 14, 500 / 14]);
  });

  it('when there is one weigh-in day, then there is no gain yet', () => {
    expect(gainSummary([{ weighedOn: '2026-04-29', totalGrams: 600, headCount: 1 }]).gramsPerDay).toBeNull();
    expect(gainSummary([]).gramsPerDay).toBeNull();
    expect(averageDailyGain({ weighedOn: '2026-04-29', totalGrams: 600, headCount: 1 }, { weighedOn: '2026-04-29', totalGrams: 650, headCount: 1 })).toBeNull();
  });

  it('when a weigh-in has no weight, a zero head count or no date, then it is refused', () => {
    expect(() => gainSummary([{ weighedOn: '2026-04-29', totalGrams: -5, headCount: 1 }])).toThrow('A weigh-in needs a weight above zero');
    expect(() => gainSummary([{ weighedOn: '2026-04-29', totalGrams: 500, headCount: 0 }])).toThrow('A weigh-in needs a head count of at least 1');
    expect(() => gainSummary([{ weighedOn: '29/04/2026', totalGrams: 500, headCount: 1 }])).toThrow(RangeError);
    expect(() => gainFromBirth('2026-04-29', 55, { weighedOn: '2026-04-29', totalGrams: 500, headCount: 1 })).toThrow(RangeError);
  });

  it('when kits of two litters make a group, then its birth date is the head-weighted mean kindling date', () => {
    expect(groupBirthDate([{ kindledOn: '2026-04-01', heads: 6 }, { kindledOn: '2026-04-05', heads: 2 }])).toBe('2026-04-02');
    expect(() => groupBirthDate([])).toThrow(RangeError);
  });

  it('when the co-op average is asked at the weigh-in ages, then weigh-ins near each age count by their heads', () => {
    const rows = averageWeightByAge(
      [{ ageDays: 27, totalGrams: 6000, headCount: 10 }, { ageDays: 30, totalGrams: 1400, headCount: 2 }, { ageDays: 41, totalGrams: 1000, headCount: 1 }],
      [28, 42, 56],
    );
    expect(rows).toEqual([
      { ageDays: 28, gramsPerHead: 7400 / 12, heads: 12, weighIns: 2 },
      { ageDays: 42, gramsPerHead: 1000, heads: 1, weighIns: 1 },
      { ageDays: 56, gramsPerHead: null, heads: 0, weighIns: 0 },
    ]);
  });
});

describe('weights possible for the age', () => {
  it('when a weight is zero or beyond any rabbit, then it is an error', () => {
    expect(checkWeightForAge(0, 28)).toMatchObject({ level: 'error', code: 'not_positive' });
    expect(checkWeightForAge(25_000, null)).toMatchObject({ level: 'error', code: 'absurd' });
  });

  it('when an 8-week kit weighs 1,644 g, then it is fine; 800 g is a warning; 6,000 g is an error', () => {
    expect(checkWeightForAge(1644, 56)).toBeNull();
    expect(checkWeightForAge(800, 56)).toMatchObject({ level: 'warning', code: 'unusual', expectedGrams: 1644 });
    expect(checkWeightForAge(6000, 56)).toMatchObject({ level: 'error', code: 'absurd' });
  });

  it('when the age is not known, then only the absolute limits apply', () => {
    expect(checkWeightForAge(300, null)).toBeNull();
  });
});
