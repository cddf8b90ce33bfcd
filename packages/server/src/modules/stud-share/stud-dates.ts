/** Calendar dates of Stud Share (YYYY-MM-DD, the farms' own days), and how texts and e-mails say them. */

const DAY_MS = 86_400_000;
const months = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

const parts = (date: string) => {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return { y, m, d };
};

export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

export function dayAfter(date: string): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + DAY_MS).toISOString().slice(0, 10);
}

/** "3 March 2027". */
export function formatDay(date: string): string {
  const { y, m, d } = parts(date);
  return `${d} ${months[m - 1]} ${y}`;
}

/** "3–17 March 2027", "28 February – 3 March 2027", or one day. */
export function formatRange(start: string, end: string): string {
  if (start === end) return formatDay(start);
  const a = parts(start);
  const b = parts(end);
  if (a.y === b.y && a.m === b.m) return `${a.d}–${b.d} ${months[b.m - 1]} ${b.y}`;
  if (a.y === b.y) return `${a.d} ${months[a.m - 1]} – ${b.d} ${months[b.m - 1]} ${b.y}`;
  return `${formatDay(start)} – ${formatDay(end)}`;
}
