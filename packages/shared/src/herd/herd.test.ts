import { describe, expect, it } from 'vitest';
import { poundsToGrams } from '../units/units';
import { ageClassOf } from './age-class';
import { weightAgainstStandard } from './breed-standard';
import { MEDIUM_BREED_FIRST_BREEDING_DAYS, youngParentAt } from './first-breeding';
import { addDays, addMonths, daysBetween, isIsoDate, todayIn } from './herd-dates';

describe('herd dates', () => {
  it('when months are added to a month end, then the day falls on the shorter month\'s last day', () => {
    expect(addMonths('2025-01-31', 1)).toBe('2025-02-28');
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29');
    expect(addMonths('2024-08-15', 6)).toBe('2025-02-15');
    expect(addDays('2024-02-28', 2)).toBe('2024-03-01');
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
  });

  it('when a date is read, then only real calendar days pass', () => {
    expect(isIsoDate('2024-02-29')).toBe(true);
    expect(isIsoDate('2023-02-29')).toBe(false);
    expect(isIsoDate('2024-2-1')).toBe(false);
  });

  it('when it is late evening in Chicago, then today is still the Chicago date', () => {
    expect(todayIn('America/Chicago', new Date('2025-03-02T04:30:00Z'))).toBe('2025-03-01');
    expect(todayIn('UTC', new Date('2025-03-02T04:30:00Z'))).toBe('2025-03-02');
  });
});

describe('show age classes (UF/IFAS Florida 4-H)', () => {
  const born = '2024-01-10';
  it('when a breed shows in six classes, then junior under 6 months, intermediate 6–8 months, senior from 8 months', () => {
    expect(ageClassOf(born, '2024-07-09', 6)).toBe('junior');
    expect(ageClassOf(born, '2024-07-10', 6)).toBe('intermediate');
    expect(ageClassOf(born, '2024-09-09', 6)).toBe('intermediate');
    expect(ageClassOf(born, '2024-09-10', 6)).toBe('senior');
  });

  it('when a breed shows in four classes, then junior under 6 months and senior from 6 months', () => {
    expect(ageClassOf(born, '2024-07-09', 4)).toBe('junior');
    expect(ageClassOf(born, '2024-07-10', 4)).toBe('senior');
  });
});

describe('first-breeding age (Rabbit Production, 9th ed.: medium breeds, does 4½–5½ months, bucks a month later)', () => {
  it('when the medium-breed default is asked, then it is 4½ months for does and 5½ for bucks in days', () => {
    // 4.5 × 30.4375 = 137; 5.5 × 30.4375 = 167 (days, rounded).
    expect(MEDIUM_BREED_FIRST_BREEDING_DAYS).toEqual({ doe: 137, buck: 167 });
  });

  it('when a doe was 120 days old at her litter\'s birth, then she is flagged; at 140 days she is not', () => {
    const ages = { doe: 137, buck: 167 };
    expect(youngParentAt({ sex: 'doe', birthDate: '2024-01-01' }, addDays('2024-01-01', 120), ages)).toEqual({ ageDays: 120, minimumDays: 137 });
    expect(youngParentAt({ sex: 'doe', birthDate: '2024-01-01' }, addDays('2024-01-01', 140), ages)).toBeNull();
    expect(youngParentAt({ sex: 'buck', birthDate: '2024-01-01' }, addDays('2024-01-01', 150), ages)).toEqual({ ageDays: 150, minimumDays: 167 });
    expect(youngParentAt({ sex: 'buck', birthDate: null }, '2024-06-01', ages)).toBeNull();
  });
});

describe('weight against the breed standard', () => {
  // New Zealand senior doe 10–12 lb (ARBA Standard of Perfection, as quoted second-hand: sec), at NIST's 453.59237 g/lb.
  const nzDoe = { minGrams: Math.round(poundsToGrams(10)), maxGrams: Math.round(poundsToGrams(12)) };
  it('when a senior New Zealand doe weighs 9.5, 11 and 12.5 lb, then she is below, within and above the standard', () => {
    expect(nzDoe).toEqual({ minGrams: 4536, maxGrams: 5443 });
    expect(weightAgainstStandard(Math.round(poundsToGrams(9.5)), nzDoe)).toBe('below');
    expect(weightAgainstStandard(Math.round(poundsToGrams(11)), nzDoe)).toBe('within');
    expect(weightAgainstStandard(Math.round(poundsToGrams(12.5)), nzDoe)).toBe('above');
  });

  it('when a breed has only a minimum (Flemish Giant) or no standard, then only "below" or "no standard" can come back', () => {
    const flemishDoe = { minGrams: Math.round(poundsToGrams(14)), maxGrams: null };
    expect(weightAgainstStandard(9000, flemishDoe)).toBe('within');
    expect(weightAgainstStandard(6000, flemishDoe)).toBe('below');
    expect(weightAgainstStandard(6000, null)).toBe('no_standard');
  });
});
