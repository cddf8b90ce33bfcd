import { describe, expect, it } from 'vitest';
import { weighInSchedule } from './weigh-in-schedule';

// The farm's ages are the Almanac defaults, 28, 42, 56 and 70 days (common practice: weaning at 4 weeks,
// the 8-week fryer weight of Rao et al. 1977, 8–10 weeks to market per Oregon State Ext. Bulletin 745).
const AGES = [28, 42, 56, 70];

describe('the farm weigh-in ages over a grow-out group', () => {
  it('when a group formed at 36 days was weighed at 41 days and today is day 58, then 42 is weighed, 56 due, 70 upcoming and 28 (before the group) left out', () => {
    const schedule = weighInSchedule({ birthDate: '2026-01-01', agesDays: AGES, formedOn: '2026-02-06', closedOn: null, weighedOn: ['2026-02-11'], today: '2026-02-28' });
    expect(schedule).toEqual([
      { ageDays: 42, on: '2026-02-12', state: 'weighed', weighedOn: '2026-02-11' },
      { ageDays: 56, on: '2026-02-26', state: 'due', weighedOn: null },
      { ageDays: 70, on: '2026-03-12', state: 'upcoming', weighedOn: null },
    ]);
  });

  it('when an age passed by more than a week unweighed, or the group closed before weighing it, then it is missed; ages after closing are left out', () => {
    const open = weighInSchedule({ birthDate: '2026-01-01', agesDays: AGES, formedOn: '2026-01-29', closedOn: null, weighedOn: [], today: '2026-02-28' });
    expect(open.map((a) => [a.ageDays, a.state])).toEqual([[28, 'missed'], [42, 'missed'], [56, 'due'], [70, 'upcoming']]);
    const closed = weighInSchedule({ birthDate: '2026-01-01', agesDays: AGES, formedOn: '2026-01-29', closedOn: '2026-03-01', weighedOn: ['2026-02-26'], today: '2026-04-01' });
    expect(closed.map((a) => [a.ageDays, a.state])).toEqual([[28, 'missed'], [42, 'missed'], [56, 'weighed']]);
  });

  it('when two weighings fall near one age, then the nearer one counts for it; a weighing 8 days off counts for none', () => {
    const schedule = weighInSchedule({ birthDate: '2026-01-01', agesDays: [56], formedOn: '2026-02-01', closedOn: null, weighedOn: ['2026-02-21', '2026-02-25'], today: '2026-02-26' });
    expect(schedule[0]).toMatchObject({ state: 'weighed', weighedOn: '2026-02-25' });
    const far = weighInSchedule({ birthDate: '2026-01-01', agesDays: [56], formedOn: '2026-02-01', closedOn: null, weighedOn: ['2026-02-18'], today: '2026-02-20' });
    expect(far[0]).toMatchObject({ state: 'due', weighedOn: null });
  });
});
