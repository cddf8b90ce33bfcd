import { MEDIUM_BREED_FIRST_BREEDING_DAYS } from '../herd/first-breeding';
import { daysBetween, isIsoDate } from '../herd/herd-dates';
import type { Sex } from '../herd/herd-enums';
import { CYCLE_SETTING_SOURCES, DEFAULT_CYCLE_SETTINGS, type CycleSettings } from './cycle-settings';

/**
 * Checks on breeding records before they are saved. An `error` refuses the record (nothing is written);
 * a `warning` is shown and the breeder may confirm (she may know better).
 */
export interface BreedingCheck {
  level: 'error' | 'warning';
  code:
    | 'bad_date'
    | 'in_future'
    | 'kindling_before_service'
    | 'kindling_too_late'
    | 'kindling_outside_window'
    | 'palpation_before_service'
    | 'palpation_early'
    | 'not_a_doe'
    | 'not_a_buck'
    | 'open_service'
    | 'young_doe'
    | 'young_buck'
    | 'under_treatment';
  field: string;
  message: string;
}

/** No gestation runs this long; a later "kindling" belongs to another service (the bad-input rule). */
export const MAX_DAYS_SERVICE_TO_KINDLING = 40;

export const hasBreedingErrors = (checks: ReadonlyArray<BreedingCheck>): boolean => checks.some((c) => c.level === 'error');

/** Something that has happened cannot be dated after `today` (the farm's today, see todayIn). */
export function checkHappened(date: string, today: string, what: string, field: string): BreedingCheck | null {
  if (!isIsoDate(date)) return { level: 'error', code: 'bad_date', field, message: `${what}: enter a date as YYYY-MM-DD` };
  if (date > today) return { level: 'error', code: 'in_future', field, message: `${what} on ${date} is in the future (today is ${today})` };
  return null;
}

/**
 * A kindling must come after its service and within 40 days of it; outside the farm's kindling window
 * (by default days 29–35, Merck Veterinary Manual) it is a warning: check the service date.
 */
export function checkKindlingDate(
  serviceDate: string, kindlingDate: string, today: string, settings: CycleSettings = DEFAULT_CYCLE_SETTINGS,
): BreedingCheck[] {
  const happened = checkHappened(kindlingDate, today, 'The kindling', 'kindledOn');
  if (happened) return [happened];
  const day = daysBetween(serviceDate, kindlingDate);
  if (day <= 0) {
    return [{
      level: 'error', code: 'kindling_before_service', field: 'kindledOn',
      message: `The kindling on ${kindlingDate} is ${day === 0 ? 'on the day of' : 'before'} its service on ${serviceDate}`,
    }];
  }
  if (day > MAX_DAYS_SERVICE_TO_KINDLING) {
    return [{
      level: 'error', code: 'kindling_too_late', field: 'kindledOn',
      message: `The kindling is ${day} days after the service; more than ${MAX_DAYS_SERVICE_TO_KINDLING} days cannot be the same pregnancy. Record a new service`,
    }];
  }
  if (day < settings.kindlingWindowStartDays || day > settings.kindlingWindowEndDays) {
    return [{
      level: 'warning', code: 'kindling_outside_window', field: 'kindledOn',
      message: `Day ${day} after the service is outside the kindling window (days ${settings.kindlingWindowStartDays}–${settings.kindlingWindowEndDays}); check the service date`,
    }];
  }
  return [];
}

/** A palpation after its service, not in the future; before the published day 10 it is a warning (hard to feel). */
export function checkPalpationDate(serviceDate: string, palpationDate: string, today: string): BreedingCheck[] {
  const happened = checkHappened(palpationDate, today, 'The palpation', 'palpatedOn');
  if (happened) return [happened];
  const day = daysBetween(serviceDate, palpationDate);
  if (day <= 0) {
    return [{ level: 'error', code: 'palpation_before_service', field: 'palpatedOn', message: `The palpation on ${palpationDate} is not after the service on ${serviceDate}` }];
  }
  const earliest = CYCLE_SETTING_SOURCES.palpationDays.published!.min;
  if (day < earliest) {
    return [{
      level: 'warning', code: 'palpation_early', field: 'palpatedOn',
      message: `Day ${day} is early to palpate; kits are usually felt from day ${earliest} (Merck Veterinary Manual)`,
    }];
  }
  return [];
}

/** A parent younger than her (or his) breed's first-breeding age on the service date: a warning. */
export function checkBreedingAge(
  animal: { sex: Sex; birthDate: string | null },
  serviceDate: string,
  firstBreedingMinDays: { doe: number; buck: number } | null = null,
): BreedingCheck | null {
  if (!animal.birthDate) return null;
  const ages = firstBreedingMinDays ?? MEDIUM_BREED_FIRST_BREEDING_DAYS;
  const minimum = animal.sex === 'doe' ? ages.doe : ages.buck;
  const age = daysBetween(animal.birthDate, serviceDate);
  if (age >= minimum) return null;
  const doe = animal.sex === 'doe';
  return {
    level: 'warning', code: doe ? 'young_doe' : 'young_buck', field: doe ? 'doeId' : 'buckId',
    message: `The ${doe ? 'doe' : 'buck'} is ${age} days old; ${doe ? 'her' : 'his'} breed is usually first bred from ${minimum} days`,
  };
}

export interface ServiceCheckInput {
  serviceDate: string;
  today: string;
  doe: { sex: Sex; birthDate: string | null; underTreatment?: boolean; firstBreedingMinDays?: { doe: number; buck: number } | null };
  buck?: { sex: Sex; birthDate: string | null; firstBreedingMinDays?: { doe: number; buck: number } | null } | null;
  /** The date of the doe's service that is still open (not kindled, not closed as missed), if any. */
  openServiceDate?: string | null;
}

/**
 * Everything to check before a service is saved: the doe is a doe and the buck a buck, the date has
 * happened, she carries no open service; and the warnings: too young for her breed (Rabbit Production,
 * 9th ed.: medium breeds 4½–5½ months, bucks about a month later) or under treatment.
 */
export function checkService(input: ServiceCheckInput): BreedingCheck[] {
  const checks: BreedingCheck[] = [];
  const happened = checkHappened(input.serviceDate, input.today, 'The service', 'servicedOn');
  if (happened) checks.push(happened);
  if (input.doe.sex !== 'doe') checks.push({ level: 'error', code: 'not_a_doe', field: 'doeId', message: 'That animal is a buck; choose a doe' });
  if (input.buck && input.buck.sex !== 'buck') checks.push({ level: 'error', code: 'not_a_buck', field: 'buckId', message: 'That animal is a doe; choose a buck' });
  if (input.openServiceDate) {
    checks.push({
      level: 'error', code: 'open_service', field: 'doeId',
      message: `She was served on ${input.openServiceDate} and no kindling is recorded yet; record it or close that service as missed first`,
    });
  }
  if (happened) return checks;
  if (input.doe.sex === 'doe') {
    const young = checkBreedingAge(input.doe, input.serviceDate, input.doe.firstBreedingMinDays ?? null);
    if (young) checks.push(young);
  }
  if (input.buck && input.buck.sex === 'buck') {
    const young = checkBreedingAge(input.buck, input.serviceDate, input.buck.firstBreedingMinDays ?? null);
    if (young) checks.push(young);
  }
  if (input.doe.underTreatment) {
    checks.push({ level: 'warning', code: 'under_treatment', field: 'doeId', message: 'She is under treatment; ask the veterinarian before breeding her' });
  }
  return checks;
}
