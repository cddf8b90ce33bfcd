const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
const dateOnly = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

/** An instant from the API (ISO), in the reader's own clock: "Mar 4, 2026, 3:05 PM". */
export function formatInstant(iso: string): string {
  return dateTime.format(new Date(iso));
}

/** The date part of an instant, in the reader's own clock: "Mar 4, 2026" (farm days are in ./days). */
export function formatInstantDate(iso: string): string {
  return dateOnly.format(new Date(iso));
}
