import { describe, expect, it } from 'vitest';
import { addDays } from '../herd/herd-dates';
import { gompertzWeight } from './gompertz';
import { projectTargetDate, readyBy, type GrowthProjection } from './projection';

const birth = '2026-03-01';
const w = (age: number, perHead: number, heads = 6) => ({ weighedOn: addDays(birth, age), totalGrams: perHead * heads, headCount: heads });

describe('projected ready date', () => {
  it('when there is one weigh-in, then there is no projection and the model says so', () => {
    const p = projectTargetDate({ birthDate: birth, weighIns: [w(28, 600)], targetGrams: 2270 });
    expect(p).toMatchObject({ status: 'too_few_weigh_ins', projectedOn: null, interval: null, model: { kind: 'none' } });
  });

  it('when the latest weigh-in is at the target, then the group has reached it since the first weigh-in at target', () => {
    const p = projectTargetDate({ birthDate: birth, weighIns: [w(56, 1700), w(63, 2280), w(70, 2500)], targetGrams: 2270 });
    expect(p).toMatchObject({ status: 'reached', reachedOn: addDays(birth, 63) });
  });

  it('when the weigh-ins show no gain, then it says so instead of a date', () => {
    expect(projectTargetDate({ birthDate: birth, weighIns: [w(28, 600), w(42, 590)], targetGrams: 2270 }).status).toBe('not_gaining');
    expect(projectTargetDate({ birthDate: birth, weighIns: [w(28, 600), w(35, 590), w(42, 580)], targetGrams: 2270 }).status).toBe('not_gaining');
  });

  it('when a weigh-in is before the birth date, or the level or target is impossible, then it is refused', () => {
    expect(() => projectTargetDate({ birthDate: birth, weighIns: [w(-1, 60), w(28, 600)], targetGrams: 2270 })).toThrow(RangeError);
    expect(() => projectTargetDate({ birthDate: birth, weighIns: [w(28, 600)], targetGrams: 2270, level: 1 })).toThrow(RangeError);
    expect(() => projectTargetDate({ birthDate: birth, weighIns: [w(28, 600)], targetGrams: 0 })).toThrow(RangeError);
    expect(() => projectTargetDate({ birthDate: birth, weighIns: [{ ...w(28, 600), headCount: 0 }], targetGrams: 2270 })).toThrow(RangeError);
  });

  it('when two weigh-ins fall on one day, then they are pooled per head', () => {
    const p = projectTargetDate({ birthDate: birth, weighIns: [w(28, 600, 4), w(28, 700, 4), w(42, 1100)], targetGrams: 2270 });
    expect(p.model.kind).toBe('linear_two_point');
    expect(p.model.line!.gramsPerDay).toBeCloseTo((1100 - 650) / 14, 9);
  });

  it('when a line is asked for three weigh-ins, then a least-squares line is used and said', () => {
    const p = projectTargetDate({ birthDate: birth, weighIns: [w(28, 600), w(35, 850), w(42, 1100)], targetGrams: 2270, model: 'linear' });
    expect(p.model.kind).toBe('linear_least_squares');
    expect(p.model.line!.gramsPerDay).toBeCloseTo(250 / 7, 9);
    expect(p.projectedAgeDays).toBeCloseTo(28 + (2270 - 600) / (250 / 7), 9);
    expect(p.interval!.from <= p.projectedOn! && p.projectedOn! <= p.interval!.to).toBe(true);
  });

  it('when a wider level is asked, then the interval is at least as wide', () => {
    const weighIns = [w(28, 560), w(42, 1050), w(56, 1600)];
    const narrow = projectTargetDate({ birthDate: birth, weighIns, targetGrams: 2270, level: 0.5 });
    const wide = projectTargetDate({ birthDate: birth, weighIns, targetGrams: 2270, level: 0.95 });
    expect(wide.interval!.from <= narrow.interval!.from && wide.interval!.to >= narrow.interval!.to).toBe(true);
    expect(wide.interval!.level).toBe(0.95);
  });

  it('when the curve levels off under the target (a small breed, a high target), then no date is promised', () => {
    const small = { matureGrams: 2300, b: 3.7, k: 0.035 };
    const weighIns = [28, 42, 56, 70].map((age) => ({ weighedOn: addDays(birth, age), totalGrams: Math.round(gompertzWeight(age, small)), headCount: 1 }));
    const p = projectTargetDate({ birthDate: birth, weighIns, targetGrams: 3000, sizeClass: 'small' });
    expect(p.status).toBe('levels_off_below_target');
    expect(p.projectedOn).toBeNull();
  });

  it('when the projection is made, then the projected day is never before the day after the last weigh-in', () => {
    const p = projectTargetDate({ birthDate: birth, weighIns: [w(28, 600), w(42, 1200), w(56, 2260)], targetGrams: 2270 });
    expect(p.projectedOn! > addDays(birth, 56)).toBe(true);
    expect(p.interval!.from > addDays(birth, 56)).toBe(true);
  });
});

describe('ready by a date', () => {
  const projection = (over: Partial<GrowthProjection>): GrowthProjection => ({
    status: 'projected', targetGrams: 2270, model: { kind: 'gompertz', description: '', weighInDays: 4 }, projectedOn: '2026-05-10',
    projectedAgeDays: 70, interval: { from: '2026-05-07', to: '2026-05-14', level: 0.9 }, reachedOn: null,
    latest: { weighedOn: '2026-04-26', gramsPerHead: 1700, headCount: 7, ageDays: 56 }, message: '', ...over,
  });

  it('when groups are asked about a processing day, then each is reached, ready, likely, possible, not ready or unknown, soonest first', () => {
    const groups = [
      { id: 'late', projection: projection({ projectedOn: '2026-05-30', interval: { from: '2026-05-25', to: '2026-06-04', level: 0.9 } }) },
      { id: 'possible', projection: projection({ projectedOn: '2026-05-14', interval: { from: '2026-05-10', to: '2026-05-18', level: 0.9 } }) },
      { id: 'likely', projection: projection({}) },
      { id: 'ready', projection: projection({ projectedOn: '2026-05-05', interval: { from: '2026-05-03', to: '2026-05-08', level: 0.9 } }) },
      { id: 'none', projection: projection({ status: 'too_few_weigh_ins', projectedOn: null, interval: null }) },
      { id: 'done', projection: projection({ status: 'reached', reachedOn: '2026-04-30', projectedOn: null, interval: null }) },
    ];
    const result = readyBy(groups, '2026-05-12');
    expect(result.map((r) => [r.group.id, r.readiness])).toEqual([
      ['done', 'reached'], ['ready', 'ready'], ['likely', 'likely'], ['possible', 'possible'], ['late', 'not_ready'], ['none', 'unknown'],
    ]);
    expect(result[0]).toMatchObject({ projectedOn: '2026-04-30', headCount: 7 });
  });
});
