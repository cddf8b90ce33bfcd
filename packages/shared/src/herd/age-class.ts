import { addMonths } from './herd-dates';

export const ageClasses = ['junior', 'intermediate', 'senior'] as const;
export type AgeClass = (typeof ageClasses)[number];

/**
 * Show age class from the birth date and the breed's class rule (UF/IFAS Florida 4-H, pub):
 * six-class breeds (ideal weight ≥ 9 lb): junior under 6 months, intermediate 6 to 8 months, senior
 * from 8 months; four-class breeds: junior under 6 months, senior from 6 months. An animal whose
 * breed is unknown follows the four-class rule.
 */
export function ageClassOf(birthDate: string, onDate: string, showClassCount: 4 | 6): AgeClass {
  if (onDate < addMonths(birthDate, 6)) return 'junior';
  if (showClassCount === 6 && onDate < addMonths(birthDate, 8)) return 'intermediate';
  return 'senior';
}
