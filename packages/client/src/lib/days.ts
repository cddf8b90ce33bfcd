import { addDays } from '@burrowline/shared';

/**
 * Trade dates are plain YYYY-MM-DD days on the farm's clock. They are formatted as UTC midnights, so a
 * reader in another time zone never sees the day before.
 */
const fmt = (options: Intl.DateTimeFormatOptions) => new Intl.DateTimeFormat(undefined, { ...options, timeZone: 'UTC' });
const weekdayDay = fmt({ weekday: 'short', day: 'numeric', month: 'short' });
const longDay = fmt({ weekday: 'long', day: 'numeric', month: 'long' });
const dayMonthYear = fmt({ day: 'numeric', month: 'short', year: 'numeric' });
const monthYear = fmt({ month: 'long', year: 'numeric' });

const asDate = (day: string) => new Date(`${day}T00:00:00Z`);

/** "Tue, 4 Mar": a farm day with its weekday (instants are in ./dates). */
export const formatWeekdayDay = (day: string) => weekdayDay.format(asDate(day));
export const formatLongDay = (day: string) => longDay.format(asDate(day));
export const formatDate = (day: string) => dayMonthYear.format(asDate(day));
export const formatMonth = (day: string) => monthYear.format(asDate(day));

/** "Today", "Tomorrow", "Yesterday", or the weekday and date. */
export function relativeDay(day: string, today: string): string {
  if (day === today) return 'Today';
  if (day === addDays(today, 1)) return 'Tomorrow';
  if (day === addDays(today, -1)) return 'Yesterday';
  return formatWeekdayDay(day);
}

export function firstOfMonth(day: string): string {
  return `${day.slice(0, 7)}-01`;
}

/** The first of the month `offset` months from `day`'s month. */
export function shiftMonth(day: string, offset: number): string {
  const [y, m] = day.split('-').map(Number) as [number, number];
  const d = new Date(Date.UTC(y, m - 1 + offset, 1));
  return d.toISOString().slice(0, 10);
}

/** The Monday-first weeks covering a month, as YYYY-MM-DD days (6 rows at most). */
export function monthGrid(first: string): string[][] {
  const weekday = (asDate(first).getUTCDay() + 6) % 7; // Monday = 0
  const start = addDays(first, -weekday);
  const month = first.slice(0, 7);
  const weeks: string[][] = [];
  for (let w = 0; w < 6; w++) {
    const week = Array.from({ length: 7 }, (_, i) => addDays(start, w * 7 + i));
    if (w > 0 && week[0]!.slice(0, 7) !== month) break;
    weeks.push(week);
  }
  return weeks;
}

export const weekdayNames = Array.from({ length: 7 }, (_, i) => fmt({ weekday: 'short' }).format(asDate(addDays('2024-01-01', i))));

/** An age in the words a breeder uses: weeks for kits, months for juniors, years and months for stock. */
export function ageWords(birthDate: string, today: string): string {
  const days = Math.round((asDate(today).getTime() - asDate(birthDate).getTime()) / 86_400_000);
  if (days < 0) return 'not born yet';
  if (days < 98) return `${Math.floor(days / 7)} wk`;
  const months = Math.floor(days / 30.4375);
  if (months < 24) return `${months} mo`;
  return `${Math.floor(months / 12)} yr${months % 12 ? ` ${months % 12} mo` : ''}`;
}
