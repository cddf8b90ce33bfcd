/** An instant in the reader's own clock, e.g. "Tue 1 Dec, 14:05". */
export function formatInstant(iso: string): string {
  return new Intl.DateTimeFormat(undefined, { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' }).format(new Date(iso));
}
