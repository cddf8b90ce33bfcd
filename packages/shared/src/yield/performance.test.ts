import { describe, expect, it } from 'vitest';
import { DEFAULT_CYCLE_SETTINGS } from '../breeding/cycle-settings';
import { addDays } from '../herd/herd-dates';
import { buckPerformance, doePerformance, missedInARow, serviceOutcome, type PerformanceLitter, type ServiceRecord } from './performance';
import { keepCullSuggestions } from './suggestions';
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

  it('when she has missed her last two services, then culling is suggested with the reason', () => {
    expect(keepCullSuggestions(perf)).toEqual([{ action: 'consider_culling', code: 'missed_in_a_row', reason: 'Her last 2 services missed one after another' }]);
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
