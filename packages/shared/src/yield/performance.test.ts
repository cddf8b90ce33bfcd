import { describe, expect, it } from 'vitest';
import { DEFAULT_CYCLE_SETTINGS } from '../breeding/cycle-settings';
import { addDays } from '../herd/herd-dates';
import { buckPerformance, doePerformance, missedInARow, serviceOutcome, type PerformanceLitter, type ServiceRecord } from './performance';
import { keepCullSuggestions, yearlyOutputOf } from './suggestions';
import { compareByKey, summarizeMetric } from './comparison';

// A fixture doe whose figures were worked out by hand (dates counted on a calendar).
const services: ServiceRecord[] = [
  { servicedOn: '2025-01-05', outcome: 'kindled' },
  { servicedOn: '2025-03-20', outcome: 'kindled' },
  { servicedOn: '2025-06-01', outcome: 'missed' },
  { servicedOn: '2025-07-01', outcome: 'kindled' },
  { servicedOn: '2025-09-20', outcome: 'missed' },
  { servicedOn: '2025-10-25', outcome: 'missed' },
  { servicedOn: '2025-12-20', outcome: 'open' },
];
const litters: PerformanceLitter[] = [
  { kindledOn: '2025-02-05', bornAlive: 9, bornDead: 1, weaningWeightGrams: 8000, events: [
    { kind: 'lost', on: '2025-02-07', count: 1, cause: 'crushed' }, { kind: 'weaned', on: '2025-03-19', count: 8 }] },
  { kindledOn: '2025-04-20', bornAlive: 7, bornDead: 0, weaningWeightGrams: 6300, events: [
    { kind: 'fostered_in', on: '2025-04-21', count: 1, otherLitterId: 'X' }, { kind: 'lost', on: '2025-04-25', count: 2, cause: 'unknown' },
    { kind: 'weaned', on: '2025-06-01', count: 6 }] },
  { kindledOn: '2025-08-01', bornAlive: 10, bornDead: 2, weaningWeightGrams: 7600, events: [
    { kind: 'fostered_out', on: '2025-08-02', count: 2, otherLitterId: 'Y' }, { kind: 'weaned', on: '2025-09-12', count: 8 }] },
];

describe('per-doe performance from plain records', () => {
  const perf = doePerformance({ services, litters, carcasses: [{ processedOn: '2025-05-10', carcassGrams: 9000 }] }, { from: '2025-01-01', to: '2025-12-31' });

  it('when her year is summed, then the figures match the hand-worked ones', () => {
    // in production from her first service, 2025-01-05, to 2025-12-31: 361 days
    expect(perf).toMatchObject({ from: '2025-01-05', days: 361, services: 7, kindled: 3, missed: 3, conceptionRate: 0.5, litters: 3, missedInARow: 2 });
    expect(perf.years).toBeCloseTo(361 / 365.25, 12);
    expect(perf.littersPerYear).toBeCloseTo(3 / (361 / 365.25), 12);
    expect(perf.kindlingIntervalDays).toBe((74 + 103) / 2); // 5 Feb → 20 Apr = 74 d; 20 Apr → 1 Aug = 103 d
    expect(perf.averageBornAlive).toBeCloseTo(26 / 3, 12);
    expect(perf.averageTotalBorn).toBeCloseTo(29 / 3, 12);
    expect(perf.averageWeaned).toBeCloseTo(22 / 3, 12);
    expect(perf.survivalToWeaning).toBeCloseTo(22 / 25, 12); // raised 9 + 8 + 8
    expect(perf.averageLitterWeaningGrams).toBe(7300);
    expect(perf.kitsWeanedPerYear).toBeCloseTo(22 / (361 / 365.25), 12);
    expect(perf.carcassGramsPerYear).toBeCloseTo(9000 / (361 / 365.25), 9);
  });

  it('when she has missed her last two services, then culling is suggested with the reason, and her pro-rated output is judged too', () => {
    // 22 weaned over 361 days in service = 22.3 a year, under 25: judged although she has under a year.
    expect(keepCullSuggestions(perf)).toEqual([
      { action: 'consider_culling', code: 'missed_in_a_row', reason: 'Her last 2 services missed one after another' },
      { action: 'watch', code: 'low_output', reason: '22.3 kits weaned a year (pro-rated from her 361 days in service), against a target of about 35 (Rabbit Production, 9th ed.)' },
    ]);
  });

  it('when a period ends before it starts, then it is refused', () => {
    expect(() => doePerformance({ services, litters }, { from: '2025-12-31', to: '2025-01-01' })).toThrow(RangeError);
  });
});

describe('service outcomes and misses in a row', () => {
  it('when a service has a kindling, a negative palpation, a closed miss or a passed window, then its outcome follows', () => {
    const s = DEFAULT_CYCLE_SETTINGS;
    expect(serviceOutcome({ servicedOn: '2026-03-02', kindledOn: '2026-04-02' }, '2026-04-10', s)).toBe('kindled');
    expect(serviceOutcome({ servicedOn: '2026-03-02', palpation: 'negative' }, '2026-03-14', s)).toBe('missed');
    expect(serviceOutcome({ servicedOn: '2026-03-02', closedAsMissed: true }, '2026-03-20', s)).toBe('missed');
    expect(serviceOutcome({ servicedOn: '2026-03-02' }, '2026-04-06', s)).toBe('open'); // day 35: still in the window
    expect(serviceOutcome({ servicedOn: '2026-03-02' }, '2026-04-07', s)).toBe('missed'); // day 36
  });

  it('when open services sit between misses, then they are passed over', () => {
    expect(missedInARow([
      { servicedOn: '2026-01-01', outcome: 'missed' }, { servicedOn: '2026-02-01', outcome: 'kindled' },
      { servicedOn: '2026-03-01', outcome: 'missed' }, { servicedOn: '2026-04-01', outcome: 'missed' }, { servicedOn: '2026-05-01', outcome: 'open' },
    ])).toEqual({ count: 2, dates: ['2026-03-01', '2026-04-01'] });
  });
});

describe('keep and cull suggestions', () => {
  const base = doePerformance({ services: [], litters: [] }, { from: '2025-01-01', to: '2025-12-31' });

  it('when she has too few litters, then it is too early to say', () => {
    expect(keepCullSuggestions(base)).toEqual([{ action: 'too_early', code: 'few_records', reason: 'Fewer than two litters on record: too early to say' }]);
  });

  it('when her litters are small and poorly raised and grow slowly, then each reason is shown, culling reasons first', () => {
    const small: PerformanceLitter[] = ['2025-01-10', '2025-04-10', '2025-07-10'].map((kindledOn) => ({
      kindledOn, bornAlive: 5, bornDead: 1,
      events: [{ kind: 'lost', on: kindledOn, count: 2, cause: 'chilled' }, { kind: 'weaned', on: addDays(kindledOn, 42), count: 3 }],
    }));
    const served = small.map((l) => ({ servicedOn: addDays(l.kindledOn, -31), outcome: 'kindled' as const }));
    const perf = doePerformance({ services: served, litters: small }, { from: '2025-01-01', to: '2025-12-31' });
    const suggestions = keepCullSuggestions(perf, { litterGainsGramsPerDay: [22, 23] });
    expect(suggestions.map((s) => [s.action, s.code])).toEqual([
      ['consider_culling', 'small_litters'], ['consider_culling', 'poorly_raised'], ['watch', 'low_output'], ['watch', 'slow_growth'],
    ]);
    expect(suggestions[1]!.reason).toBe('Poorly raised litters: 60 % of her kits reached weaning over her last 3 (below 70 %)');
    expect(suggestions[3]!.reason).toBe('Her litters grow slowly: 22.5 g a day against 28.8 g for the published 28.8 g a day (Rao et al. 1977)');
  });

  it('when her record is good, then keeping her is suggested with her output', () => {
    const good: PerformanceLitter[] = ['2025-01-10', '2025-03-20', '2025-05-30', '2025-08-10', '2025-10-20'].map((kindledOn) => ({
      kindledOn, bornAlive: 9, bornDead: 0, events: [{ kind: 'weaned', on: addDays(kindledOn, 42), count: 8 }],
    }));
    const perf = doePerformance({ services: [{ servicedOn: '2024-12-10', outcome: 'kindled' }], litters: good }, { from: '2025-01-01', to: '2025-12-31' });
    expect(keepCullSuggestions(perf, { litterGainsGramsPerDay: [33, 35], comparisonGramsPerDay: 34 })).toEqual([
      { action: 'keep', code: 'good_record', reason: 'No concerns in her record; 40 kits weaned a year' },
    ]);
  });
});

describe('keep and cull: every doe judged by the same yearly-output rule', () => {
  const period = { from: '2025-01-01', to: '2025-12-31' };
  const doe = (firstService: string, kindlings: [string, number, number | null][]) => {
    const litters: PerformanceLitter[] = kindlings.map(([kindledOn, bornAlive, weaned]) => ({
      kindledOn, bornAlive, bornDead: 0, events: weaned === null ? [] : [{ kind: 'weaned', on: addDays(kindledOn, 42), count: weaned }],
    }));
    const services = [{ servicedOn: firstService, outcome: 'kindled' as const }, ...kindlings.slice(1).map(([k]) => ({ servicedOn: addDays(k, -31), outcome: 'kindled' as const }))];
    return doePerformance({ services, litters }, period);
  };

  it('when a doe has under a year in service, then her output is pro-rated and judged like any other doe\'s', () => {
    // In service from 15 Jun: 200 days; 6 + 5 = 11 weaned → 11 ÷ (200 ÷ 365.25) = 20.1 a year, under 25 (70 % of ≈ 35).
    const young = doe('2025-06-15', [['2025-07-16', 7, 6], ['2025-09-30', 7, 5]]);
    expect(young.days).toBe(200);
    expect(keepCullSuggestions(young)).toEqual([{
      action: 'watch', code: 'low_output',
      reason: '20.1 kits weaned a year (pro-rated from her 200 days in service), against a target of about 35 (Rabbit Production, 9th ed.)',
    }]);
    // A doe in service all year with 22 weaned is judged by the same words, without the pro-rating.
    const older = doe('2024-12-01', [['2025-01-01', 8, 7], ['2025-04-01', 8, 8], ['2025-08-01', 8, 7]]);
    expect(older.days).toBe(365);
    expect(keepCullSuggestions(older)).toEqual([{ action: 'watch', code: 'low_output', reason: '22 kits weaned a year, against a target of about 35 (Rabbit Production, 9th ed.)' }]);
  });

  it('when a doe has too few days in service to judge her output, then "not enough history" is said plainly, also beside other reasons', () => {
    // In service from 3 Sep: 120 days, under the 182 it takes.
    const fresh = doe('2025-09-03', [['2025-10-04', 8, 7], ['2025-12-20', 8, null]]);
    expect(fresh.days).toBe(120);
    const shortHistory = { action: 'too_early', code: 'short_history', reason: 'Only 120 days in service in this period: not enough history to judge her yearly output (that takes 182 days)' };
    expect(keepCullSuggestions(fresh)).toEqual([shortHistory]);
    const small = doe('2025-09-03', [['2025-10-04', 4, 3], ['2025-12-20', 4, null]]);
    expect(keepCullSuggestions(small).map((x) => x.code)).toEqual(['small_litters', 'short_history']);
    expect(yearlyOutputOf({ days: 1, kitsWeanedPerYear: 0 }).text).toBe('Only 1 day in service in this period: not enough history to judge her yearly output (that takes 182 days)');
  });
});

describe('per-buck figures and side-by-side comparison', () => {
  it('when a buck\'s services and litters are summed, then conception and litter figures follow', () => {
    const perf = buckPerformance({ services, litters }, { from: '2025-01-01', to: '2025-12-31' });
    expect(perf).toMatchObject({ services: 7, kindled: 3, missed: 3, conceptionRate: 0.5, littersSired: 3 });
    expect(perf.survivalToWeaning).toBeCloseTo(22 / 25, 12);
  });

  it('when units are compared by breed, then each metric is summarized over the units that have it', () => {
    const rows = compareByKey([
      { key: 'New Zealand', values: { dressOut: 55, fcr: 3.8 } },
      { key: 'New Zealand', values: { dressOut: 57, fcr: null } },
      { key: 'Californian', values: { dressOut: 56 } },
    ], ['dressOut', 'fcr']);
    expect(rows.map((r) => r.key)).toEqual(['Californian', 'New Zealand']);
    expect(rows[1]!.metrics.dressOut).toEqual({ n: 2, mean: 56, sd: Math.SQRT2, min: 55, max: 57 });
    expect(rows[1]!.metrics.fcr).toEqual({ n: 1, mean: 3.8, sd: null, min: 3.8, max: 3.8 });
    expect(rows[0]!.metrics.fcr).toEqual({ n: 0, mean: null, sd: null, min: null, max: null });
    expect(summarizeMetric([1, Number.NaN, 3]).mean).toBe(2);
  });
});
