import { daysBetween } from './herd-dates';

const dayInWords = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' });

/** A farm day as the screens write it ("Mar 4, 2026"), for messages the server words. */
export function formatDayInWords(day: string): string {
  return dayInWords.format(new Date(`${day}T00:00:00Z`));
}

/**
 * Why a kit's birth date cannot be right for its dam, or null when it fits: a kit is born the day its
 * litter was kindled, so once the farm has recorded her litters the date must be one of them. A dam
 * with no litter on the farm's record (older stock, a kindling elsewhere) is not checked.
 */
export function kitBirthDateProblem(birthDate: string, dam: { label: string; kindledOn: readonly string[] }): string | null {
  if (dam.kindledOn.length === 0 || dam.kindledOn.includes(birthDate)) return null;
  const nearest = [...new Set(dam.kindledOn)]
    .sort((a, b) => Math.abs(daysBetween(birthDate, a)) - Math.abs(daysBetween(birthDate, b)) || a.localeCompare(b))
    .slice(0, 3)
    .sort();
  const more = dam.kindledOn.length > nearest.length ? ' (the nearest to this date)' : '';
  const dates = nearest.map(formatDayInWords).join(', ');
  const litters = nearest.length === 1 ? `${dam.label}'s litter was kindled on ${dates}` : `${dam.label}'s litters were kindled on ${dates}${more}`;
  return `${litters}. A kit of hers is born on its litter's kindling day: use that date, or record the kindling of this litter first.`;
}
