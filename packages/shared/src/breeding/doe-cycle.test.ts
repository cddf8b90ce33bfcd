import { describe, expect, it } from 'vitest';
import { DEFAULT_CYCLE_SETTINGS, defaultCycleSettings } from './cycle-settings';
import { compareByDue, doeCycleState, type DoeCycleFacts } from './doe-cycle';

/*
 * Default settings (cycle-settings.ts, each with its publication): palpation day 12, nest box day 28,
 * kindling expected day 31, overdue from day 32 (Merck Veterinary Manual, "Breeding and Reproduction of
 * Rabbits", 2020: gestation 29–35 d, 31–32 typical); nest box out day 21 and weaning day 42 after kindling
 * (McNitt et al., Rabbit Production, 9th ed.; Texas Agricultural Extension Service: weaning at 4–8 weeks);
 * breed back day 35 (one of the published 7–42 d schedules); first service of a medium-breed doe at
 * 137 days (Rabbit Production, 9th ed.). Today is 2026-06-15 throughout.
 */
const today = '2026-06-15';
const s = DEFAULT_CYCLE_SETTINGS;
const doe = (f: Partial<DoeCycleFacts>): DoeCycleFacts => ({ birthDate: '2025-01-10', service: null, litter: null, ...f });
const service = (servicedOn: string, extra: Partial<NonNullable<DoeCycleFacts['service']>> = {}) =>
  ({ servicedOn, status: 'open' as const, closedOn: null, palpation: null, ...extra });

describe('a doe on the board', () => {
  it('when she was serviced 9 days ago, then she is serviced day 9 and the palpation is next on day 12 (2026-06-18)', () => {
    // 2026-06-06 + 9 = 2026-06-15; + 12 = 2026-06-18.
    expect(doeCycleState(doe({ service: service('2026-06-06') }), today, s)).toEqual({
      state: 'serviced', day: 9, kits: null, dueInDays: null, label: 'Serviced, day 9',
      next: { kind: 'palpate', label: 'Palpate', on: '2026-06-18', daysLate: 0 },
    });
  });

  it('when the palpation is 2 days late, then it stays next and says so', () => {
    // Serviced 2026-06-01: day 14 today, palpation was due 2026-06-13.
    expect(doeCycleState(doe({ service: service('2026-06-01') }), today, s).next).toEqual({ kind: 'palpate', label: 'Palpate', on: '2026-06-13', daysLate: 2 });
  });

  it('when she palpated positive on day 12, then the nest box on day 28 is next', () => {
    // Serviced 2026-05-28 (day 18); nest box 2026-05-28 + 28 = 2026-06-25.
    const state = doeCycleState(doe({ service: service('2026-05-28', { palpation: { palpatedOn: '2026-06-09', result: 'positive' } }) }), today, s);
    expect(state).toMatchObject({ state: 'palpated_positive', day: 18, label: 'Palpated positive, day 18', next: { kind: 'nest_box_in', on: '2026-06-25' } });
  });

  it('when she is on day 28, then she is due in 3 days and the nest box goes in today', () => {
    // Serviced 2026-05-18: day 28; expected kindling day 31 = 2026-06-18.
    const state = doeCycleState(doe({ service: service('2026-05-18', { palpation: { palpatedOn: '2026-05-30', result: 'positive' } }) }), today, s);
    expect(state).toMatchObject({ state: 'due', day: 28, dueInDays: 3, label: 'Due in 3 days', next: { kind: 'nest_box_in', on: '2026-06-15', daysLate: 0 } });
  });

  it('when she is on day 30, then the kindling on day 31 is next', () => {
    const state = doeCycleState(doe({ service: service('2026-05-16') }), today, s);
    expect(state).toMatchObject({ state: 'due', day: 30, dueInDays: 1, label: 'Due in 1 day', next: { kind: 'kindle', on: '2026-06-16' } });
  });

  it('when day 33 passes with no kits, then she is overdue and checking her is 1 day late', () => {
    // Serviced 2026-05-13: day 33; the overdue day 32 was 2026-06-14.
    const state = doeCycleState(doe({ service: service('2026-05-13') }), today, s);
    expect(state).toMatchObject({ state: 'overdue', day: 33, label: 'Day 33 after service, no kits recorded', next: { kind: 'check_doe', on: '2026-06-14', daysLate: 1 } });
  });

  it('when she nurses 7 kits of 12 days, then the nest box out on day 21 is next, then weaning on day 42', () => {
    // Kindled 2026-06-03: day 12; nest box out 2026-06-24; weaning 2026-07-15; breed back 2026-07-08.
    const litter = { kindledOn: '2026-06-03', onDoe: 7, weanedOn: null };
    const old = service('2026-05-03', { status: 'kindled' });
    expect(doeCycleState(doe({ service: old, litter }), today, s)).toMatchObject({
      state: 'nursing', day: 12, kits: 7, label: 'Nursing 7 kits, day 12', next: { kind: 'nest_box_out', on: '2026-06-24' },
    });
    // On day 30 the nest box is out (its day passed); breeding back on day 35 comes before the weaning on day 42.
    const later = { kindledOn: '2026-05-16', onDoe: 7, weanedOn: null };
    expect(doeCycleState(doe({ service: old, litter: later }), today, s).next).toMatchObject({ kind: 'breed_back', on: '2026-06-20' });
  });

  it('when she nurses and was bred back, then the new service\'s palpation competes with the weaning', () => {
    // Kindled 2026-05-10 (day 36, weaning 2026-06-21); bred back 2026-06-14 (palpate 2026-06-26).
    const state = doeCycleState(doe({ service: service('2026-06-14'), litter: { kindledOn: '2026-05-10', onDoe: 6, weanedOn: null } }), today, s);
    expect(state).toMatchObject({ state: 'nursing', kits: 6, day: 36, next: { kind: 'wean', on: '2026-06-21' } });
  });

  it('when her litter was weaned before the breed-back day, then she rests until it', () => {
    // Kindled 2026-05-20; weaned early 2026-06-14; breed back 2026-05-20 + 35 = 2026-06-24.
    const state = doeCycleState(doe({ service: service('2026-04-19', { status: 'kindled' }), litter: { kindledOn: '2026-05-20', onDoe: 0, weanedOn: '2026-06-14' } }), today, s);
    expect(state).toMatchObject({ state: 'resting', next: { kind: 'breed', on: '2026-06-24', daysLate: 0 } });
  });

  it('when she palpated empty, then she is open and the rebreed falls the day after', () => {
    const empty = service('2026-05-30', { status: 'empty', closedOn: '2026-06-11', palpation: { palpatedOn: '2026-06-11', result: 'negative' } });
    expect(doeCycleState(doe({ service: empty }), today, s)).toMatchObject({ state: 'open', label: 'Open, not bred', next: { kind: 'breed', on: '2026-06-12', daysLate: 3 } });
  });

  it('when a young doe has no records, then she is growing until her first service at 137 days', () => {
    // Born 2026-03-01 + 137 days = 2026-07-16.
    expect(doeCycleState(doe({ birthDate: '2026-03-01' }), today, s)).toMatchObject({ state: 'growing', next: { kind: 'first_service', on: '2026-07-16' } });
    expect(doeCycleState(doe({ birthDate: '2025-03-01' }), today, s)).toMatchObject({ state: 'open', next: { kind: 'first_service', on: '2025-07-16' } });
  });

  it('when the farm changes its cycle, then the days follow its settings', () => {
    const mine = { ...defaultCycleSettings(), palpationDays: 14 };
    expect(doeCycleState(doe({ service: service('2026-06-06') }), today, mine).next?.on).toBe('2026-06-20');
  });

  it('when does are sorted by what is due, then the most late comes first and a doe with nothing due last', () => {
    const states = [
      doeCycleState(doe({ service: service('2026-06-06') }), today, s),
      doeCycleState(doe({ service: service('2026-05-13') }), today, s),
      { ...doeCycleState(doe({}), today, s), next: null },
    ];
    expect([...states].sort(compareByDue).map((x) => x.state)).toEqual(['overdue', 'serviced', 'open']);
  });
});
