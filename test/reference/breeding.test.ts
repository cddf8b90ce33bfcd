import { describe, expect, it } from 'vitest';
import {
  addDays, checkFosterPairs, checkKindlingDate, CYCLE_SETTING_SOURCES, DEFAULT_CYCLE_SETTINGS, defaultCycleSettings, kindlingStatus, kitCount,
  litterSummary, planFromKindling, planFromService, replanOpenTasks, settleServiceTasksOnKindling, validateLitter,
  type LitterRecord, type PlannedTask, type TaskRecord,
} from '@burrowline/shared';

const due = (tasks: PlannedTask[]) => Object.fromEntries(tasks.map((t) => [t.key, t.dueOn]));

// Each date below was counted by hand on a calendar (March has 31 days, April 30) before the code ran.
describe('the Almanac plan of a service under the default settings', () => {
  it('when a doe is serviced on 2026-03-02, then palpation, nest box, kindling and its window fall on the published days (Merck Veterinary Manual; Rabbit Production, 9th ed.)', () => {
    const tasks = planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS);
    // Merck Vet Manual; Rabbit Production 9th ed.: palpation day 10–14, day 12 common → 2026-03-14
    expect(due(tasks).palpation).toBe('2026-03-14');
    // Merck Vet Manual: nest box in on day 28–29 → day 28 = 2026-03-30
    expect(due(tasks).nest_box_in).toBe('2026-03-30');
    // Merck Vet Manual: gestation 31–32 d typical → day 31 = 2026-04-02
    const kindling = tasks.find((t) => t.kind === 'kindling_due')!;
    expect(kindling.dueOn).toBe('2026-04-02');
    // Merck Vet Manual: range 29–35 d → 2026-03-31 to 2026-04-06
    expect([kindling.windowStart, kindling.windowEnd]).toEqual(['2026-03-31', '2026-04-06']);
    // Merck Vet Manual: no kits by day 32 → watch → 2026-04-03
    expect(due(tasks).kindling_overdue).toBe('2026-04-03');
  });

  // The published ranges as the publications state them, written here, not read from the code.
  const PUBLISHED = {
    palpationDays: { min: 10, max: 14, source: 'Merck Veterinary Manual, "Breeding and Reproduction of Rabbits"; McNitt et al., Rabbit Production, 9th ed., CABI 2013: day 10–14' },
    nestBoxInDays: { min: 28, max: 29, source: 'Merck Veterinary Manual: day 28–29 after service' },
    kindlingExpectedDays: { min: 31, max: 32, source: 'Merck Veterinary Manual: gestation 31–32 days typical' },
    kindlingWindowStartDays: { min: 29, max: 35, source: 'Merck Veterinary Manual: gestation 29–35 days' },
    kindlingWindowEndDays: { min: 29, max: 35, source: 'Merck Veterinary Manual: gestation 29–35 days' },
    kindlingOverdueDays: { min: 32, max: 32, source: 'Merck Veterinary Manual: no kits by day 32, watch' },
    nestBoxOutDays: { min: 15, max: 21, source: 'McNitt et al., Rabbit Production, 9th ed.: 15–21 days after kindling' },
    weaningDays: { min: 28, max: 56, source: 'Texas Agricultural Extension Service, Backyard Production of Meat Rabbits in Texas: 4–8 weeks' },
    breedBackDays: { min: 7, max: 42, source: 'McNitt et al., Rabbit Production, 9th ed.; Texas Agricultural Extension Service: 7 to 42 days' },
    // Oregon State Univ. Ext. Bulletin 745 (Bogart, 1962): 4–5 lb at 8 weeks = 1,814–2,268 g (NIST Handbook 44: 1 lb = 453.59237 g).
    targetLiveWeightGrams: { min: 1814, max: 2268, source: 'Oregon State Univ. Ext. Bulletin 745: 4–5 lb at 8 weeks' },
  } as const;

  it('when the defaults are read, then each sits inside the range its publication states and carries that range', () => {
    for (const [key, published] of Object.entries(PUBLISHED) as [keyof typeof PUBLISHED, (typeof PUBLISHED)[keyof typeof PUBLISHED]][]) {
      expect(CYCLE_SETTING_SOURCES[key].published, key).toEqual({ min: published.min, max: published.max });
      const value = DEFAULT_CYCLE_SETTINGS[key];
      // The 2,270 g target is 5 lb (2,268 g) to the nearest 10 g, common practice.
      const slack = key === 'targetLiveWeightGrams' ? 2 : 0;
      expect(value, `${key}: ${published.source}`).toBeGreaterThanOrEqual(published.min);
      expect(value, `${key}: ${published.source}`).toBeLessThanOrEqual(published.max + slack);
    }
    expect(DEFAULT_CYCLE_SETTINGS.targetLiveWeightGrams).toBe(2270); // 5 lb, common practice
    expect(CYCLE_SETTING_SOURCES.targetLiveWeightGrams.confidence).toBe('common_practice');
  });
});

describe('the kindling window (Merck Veterinary Manual: gestation 29–35 d, no kits by day 32 → watch)', () => {
  const service = '2026-03-02';
  const on = (day: number) => kindlingStatus(service, addDays(service, day), DEFAULT_CYCLE_SETTINGS);

  it('when days 28, 29, 31, 32, 35 and 36 after the service pass without kits, then the status goes not due → in window → overdue → missed', () => {
    expect(on(28)).toBe('not_due');
    expect(on(29)).toBe('in_window');
    expect(on(31)).toBe('in_window');
    expect(on(32)).toBe('overdue');
    expect(on(35)).toBe('overdue');
    expect(on(36)).toBe('missed');
  });

  it('when a kindling is recorded inside the window, then it passes; outside it a warning asks to check the service date', () => {
    expect(checkKindlingDate(service, '2026-04-04', '2026-04-10')).toEqual([]); // day 33
    expect(checkKindlingDate(service, '2026-03-30', '2026-04-10')[0]).toMatchObject({ level: 'warning', code: 'kindling_outside_window' }); // day 28
  });
});

describe('the re-plan after a kindling follows the real date, not the expected one (Rabbit Production, 9th ed.: nest box out 15–21 d; Texas Extension: weaning 4–8 wk)', () => {
  it('when she kindles on day 30 (2026-04-01), then nest box out, weigh-ins, weaning and breed-back count from that day', () => {
    expect(due(planFromKindling('2026-04-01', DEFAULT_CYCLE_SETTINGS))).toEqual({
      nest_box_out: '2026-04-22', // +21
      'weigh_in:28': '2026-04-29',
      breed_back: '2026-05-06', // +35
      'weigh_in:42': '2026-05-13',
      weaning: '2026-05-13', // +42, a day before the 2026-05-14 the expected kindling would give
      'weigh_in:56': '2026-05-27',
      'weigh_in:70': '2026-06-10',
    });
  });

  it('when she kindles late, on day 33 (2026-04-04), then everything moves with the kindling', () => {
    expect(due(planFromKindling('2026-04-04', DEFAULT_CYCLE_SETTINGS))).toEqual({
      nest_box_out: '2026-04-25',
      'weigh_in:28': '2026-05-02',
      breed_back: '2026-05-09',
      'weigh_in:42': '2026-05-16',
      weaning: '2026-05-16',
      'weigh_in:56': '2026-05-30',
      'weigh_in:70': '2026-06-13',
    });
  });

  it('when the day-33 kindling is recorded, then the kindling task is done, the overdue alert is skipped, and done tasks never move on a change of settings', () => {
    const serviceTasks: TaskRecord[] = planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS).map((t, i) => ({
      ...t, id: `t${i}`, sourceId: 'service-1', state: t.kind === 'palpation' || t.kind === 'nest_box_in' ? 'done' : 'open',
    }));
    const settled = settleServiceTasksOnKindling(serviceTasks, '2026-04-04');
    expect(settled.done).toEqual([serviceTasks.find((t) => t.kind === 'kindling_due')!.id]);
    expect(settled.skipped.map((s) => s.reason)).toEqual(['Kindled on day 33']);

    const litterTasks: TaskRecord[] = planFromKindling('2026-04-04', DEFAULT_CYCLE_SETTINGS).map((t, i) => ({
      ...t, id: `l${i}`, sourceId: 'litter-1', state: t.kind === 'nest_box_out' ? 'done' : 'open',
    }));
    // the farm weans at 5 weeks instead (Texas Extension: 4–8 weeks)
    const replan = replanOpenTasks(litterTasks, { ...defaultCycleSettings(), weaningDays: 35, nestBoxOutDays: 18 }, '2026-04-26');
    expect(replan.changed).toEqual([{ id: litterTasks.find((t) => t.kind === 'weaning')!.id, previousDueOn: '2026-05-16', dueOn: '2026-05-09' }]);
  });
});

describe('month and leap-year boundaries (day arithmetic on calendar dates only)', () => {
  it('when serviced on 2028-01-31 (2028 is a leap year), then day 29 is 29 February and day 31 is 2 March', () => {
    const tasks = planFromService('2028-01-31', DEFAULT_CYCLE_SETTINGS);
    const kindling = tasks.find((t) => t.kind === 'kindling_due')!;
    expect(due(tasks)).toMatchObject({ palpation: '2028-02-12', nest_box_in: '2028-02-28', kindling_due: '2028-03-02', kindling_overdue: '2028-03-03' });
    expect([kindling.windowStart, kindling.windowEnd]).toEqual(['2028-02-29', '2028-03-06']);
  });

  it('when serviced on 2027-01-31 (not a leap year), then day 29 is 1 March', () => {
    const kindling = planFromService('2027-01-31', DEFAULT_CYCLE_SETTINGS).find((t) => t.kind === 'kindling_due')!;
    expect([kindling.windowStart, kindling.dueOn, kindling.windowEnd]).toEqual(['2027-03-01', '2027-03-03', '2027-03-07']);
  });

  it('when serviced on 2026-12-15, then the kindling falls in the next year', () => {
    const kindling = planFromService('2026-12-15', DEFAULT_CYCLE_SETTINGS).find((t) => t.kind === 'kindling_due')!;
    expect([kindling.windowStart, kindling.dueOn, kindling.windowEnd]).toEqual(['2027-01-13', '2027-01-15', '2027-01-19']);
  });

  it('when the 2028-02-29 kindling is planned, then weaning at 42 days is 2028-04-11', () => {
    expect(due(planFromKindling('2028-02-29', DEFAULT_CYCLE_SETTINGS)).weaning).toBe('2028-04-11');
  });
});

// Medium meat-breed litters of 8–12 born are usual (common practice); the counting rule is the definition:
// on the doe = born alive + fostered in − fostered out − lost − culled − weaned.
describe('derived kit counts through fosterings (common practice: litters of 8–12; count by definition)', () => {
  const a: LitterRecord & { id: string } = {
    id: 'A', kindledOn: '2026-04-02', bornAlive: 10, bornDead: 1,
    events: [
      { kind: 'fostered_out', on: '2026-04-03', count: 2, otherLitterId: 'B' },
      { kind: 'lost', on: '2026-04-07', count: 1, cause: 'chilled' },
      { kind: 'weaned', on: '2026-05-14', count: 7 },
    ],
  };
  const b: LitterRecord & { id: string } = {
    id: 'B', kindledOn: '2026-04-02', bornAlive: 5, bornDead: 0,
    events: [
      { kind: 'fostered_in', on: '2026-04-03', count: 2, otherLitterId: 'A' },
      { kind: 'culled', on: '2026-04-05', count: 1, reason: 'splay leg' },
      { kind: 'weaned', on: '2026-05-14', count: 6 },
    ],
  };

  it('when two kits go from a litter of 10 to a litter of 5, then the counts follow day by day', () => {
    expect([kitCount(a, '2026-04-02'), kitCount(a, '2026-04-03'), kitCount(a, '2026-04-07'), kitCount(a)]).toEqual([10, 8, 7, 0]);
    expect([kitCount(b, '2026-04-02'), kitCount(b, '2026-04-03'), kitCount(b, '2026-04-05'), kitCount(b)]).toEqual([5, 7, 6, 0]);
    expect(checkFosterPairs([a, b])).toEqual([]);
  });

  it('when the litters are weaned, then survival counts the kits each doe raised: 7 of 8 and 6 of 7', () => {
    expect(litterSummary(a)).toMatchObject({ bornAlive: 10, bornDead: 1, totalBorn: 11, fosteredOut: 2, lost: 1, weaned: 7, raised: 8, survivalToWeaning: 7 / 8 });
    expect(litterSummary(b)).toMatchObject({ fosteredIn: 2, culled: 1, weaned: 6, raised: 7, survivalToWeaning: 6 / 7 });
  });

  it('when eight are weaned from litter A, then the record is refused with the sum shown', () => {
    const issues = validateLitter({ ...a, events: [...a.events.slice(0, 2), { kind: 'weaned', on: '2026-05-14', count: 8 }] });
    expect(issues).toHaveLength(1);
    expect(issues[0]!.message).toBe(
      'Weaned 8 kits on 2026-05-14, but only 7 kits were with the doe (born alive 10 + fostered in 0 − fostered out 2 − lost 1 − culled 0 − weaned 0)',
    );
  });
});
