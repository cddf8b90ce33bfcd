import { describe, expect, it } from 'vitest';
import { checkBreedingAge, checkHappened, checkKindlingDate, checkPalpationDate, checkService, hasBreedingErrors } from './validate';

describe('breeding record checks', () => {
  it('when a kindling is before or on its service day, then it is an error', () => {
    expect(checkKindlingDate('2026-03-02', '2026-03-01', '2026-04-10')).toMatchObject([{ level: 'error', code: 'kindling_before_service' }]);
    expect(checkKindlingDate('2026-03-02', '2026-03-02', '2026-04-10')[0]!.message).toBe('The kindling on 2026-03-02 is on the day of its service on 2026-03-02');
  });

  it('when a kindling is 41 days after its service, then it is an error; 40 days is a warning', () => {
    expect(checkKindlingDate('2026-03-02', '2026-04-12', '2026-05-01')).toMatchObject([{ level: 'error', code: 'kindling_too_late' }]);
    expect(checkKindlingDate('2026-03-02', '2026-04-11', '2026-05-01')).toMatchObject([{ level: 'warning', code: 'kindling_outside_window' }]);
  });

  it('when something that happened is dated after today, then it is an error', () => {
    expect(checkHappened('2026-04-11', '2026-04-10', 'The weaning', 'on')).toMatchObject({ code: 'in_future', message: 'The weaning on 2026-04-11 is in the future (today is 2026-04-10)' });
    expect(checkHappened('2026-04-10', '2026-04-10', 'The weaning', 'on')).toBeNull();
    expect(checkHappened('10/04/2026', '2026-04-10', 'The weaning', 'on')).toMatchObject({ code: 'bad_date' });
    expect(checkKindlingDate('2026-03-02', '2026-04-02', '2026-04-01')).toMatchObject([{ code: 'in_future' }]);
  });

  it('when a palpation is before day 10, then a warning; before the service, an error', () => {
    expect(checkPalpationDate('2026-03-02', '2026-03-10', '2026-03-20')).toMatchObject([{ level: 'warning', code: 'palpation_early' }]);
    expect(checkPalpationDate('2026-03-02', '2026-03-14', '2026-03-20')).toEqual([]);
    expect(checkPalpationDate('2026-03-02', '2026-03-01', '2026-03-20')).toMatchObject([{ level: 'error', code: 'palpation_before_service' }]);
  });

  it('when a doe is younger than the medium-breed first-breeding age (137 days, Rabbit Production), then it is a warning, not an error', () => {
    const young = checkBreedingAge({ sex: 'doe', birthDate: '2025-11-01' }, '2026-03-02');
    expect(young).toMatchObject({ level: 'warning', code: 'young_doe', message: 'The doe is 121 days old; her breed is usually first bred from 137 days' });
    expect(checkBreedingAge({ sex: 'doe', birthDate: '2025-10-01' }, '2026-03-02')).toBeNull();
    expect(checkBreedingAge({ sex: 'doe', birthDate: null }, '2026-03-02')).toBeNull();
    expect(checkBreedingAge({ sex: 'buck', birthDate: '2025-10-01' }, '2026-03-02', { doe: 137, buck: 167 })).toMatchObject({ code: 'young_buck' });
  });

  it('when a buck is chosen as the doe, a doe as the buck, or she has an open service, then the service is refused', () => {
    const checks = checkService({
      serviceDate: '2026-03-02', today: '2026-03-02', openServiceDate: '2026-02-20',
      doe: { sex: 'buck', birthDate: '2024-01-01' }, buck: { sex: 'doe', birthDate: '2024-01-01' },
    });
    expect(checks.map((c) => c.code)).toEqual(['not_a_doe', 'not_a_buck', 'open_service']);
    expect(hasBreedingErrors(checks)).toBe(true);
  });

  it('when a young doe under treatment is serviced, then two warnings and no error', () => {
    const checks = checkService({
      serviceDate: '2026-03-02', today: '2026-03-03',
      doe: { sex: 'doe', birthDate: '2025-11-01', underTreatment: true }, buck: { sex: 'buck', birthDate: '2024-06-01' },
    });
    expect(checks.map((c) => [c.level, c.code])).toEqual([['warning', 'young_doe'], ['warning', 'under_treatment']]);
    expect(hasBreedingErrors(checks)).toBe(false);
  });

  it('when the service date is tomorrow, then it is refused', () => {
    expect(checkService({ serviceDate: '2026-03-04', today: '2026-03-03', doe: { sex: 'doe', birthDate: null } })).toMatchObject([{ code: 'in_future' }]);
  });
});
