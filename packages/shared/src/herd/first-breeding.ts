import { daysBetween } from './herd-dates';
import type { Sex } from './herd-enums';

/** Used when a parent's breed is unknown: the medium-breed ages (Rabbit Production, 9th ed., pub). */
export const MEDIUM_BREED_FIRST_BREEDING_DAYS = { doe: 137, buck: 167 } as const;

/**
 * Whether a parent was younger, on its offspring's birth date, than its breed's earliest usual
 * first-breeding age. A warning, not a refusal: the breeder may know better and confirm.
 */
export function youngParentAt(
  parent: { sex: Sex; birthDate: string | null },
  offspringBirthDate: string,
  firstBreedingMinDays: { doe: number; buck: number } | null,
): { ageDays: number; minimumDays: number } | null {
  if (!parent.birthDate) return null;
  const ages = firstBreedingMinDays ?? MEDIUM_BREED_FIRST_BREEDING_DAYS;
  const ageDays = daysBetween(parent.birthDate, offspringBirthDate);
  const minimumDays = parent.sex === 'doe' ? ages.doe : ages.buck;
  return ageDays < minimumDays ? { ageDays, minimumDays } : null;
}
