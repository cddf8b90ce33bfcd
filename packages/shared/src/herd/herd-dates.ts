/**
 * Calendar dates as the trade uses them: plain `YYYY-MM-DD` strings in the farm's own time zone, so a
 * kindling at 11 pm is never moved to the next day by a server clock elsewhere.
 */

const isoDate = /^(\d{4})-(\d{2})-(\d{2})$/;

function parts(date: string): [number, number, number] {
  const match = isoDate.exec(date);
  if (!match) throw new RangeError(`Not a YYYY-MM-DD date: ${date}`);
  return [Number(match[1]), Number(match[2]), Number(match[3])];
}

// Years of records repeat the same few thousand dates: each is parsed (or formatted) once. Bounded,
// so a long-running server cannot grow them without end.
const CACHED_DATES = 50_000;
const msOfDate = new Map<string, number>();
const dateOfMs = new Map<number, string>();
/** Dates `isIsoDate` found valid (records check the same few thousand dates over and over). */
const validDates = new Set<string>();

function toUtcMs(date: string): number {
  let ms = msOfDate.get(date);
  if (ms === undefined) {
    const [y, m, d] = parts(date);
    ms = Date.UTC(y, m - 1, d);
    if (msOfDate.size >= CACHED_DATES) msOfDate.clear();
    msOfDate.set(date, ms);
  }
  return ms;
}

function fromUtcMs(ms: number): string {
  let date = dateOfMs.get(ms);
  if (date === undefined) {
    date = new Date(ms).toISOString().slice(0, 10);
    if (dateOfMs.size >= CACHED_DATES) dateOfMs.clear();
    dateOfMs.set(ms, date);
  }
  return date;
}

/** Today in an IANA time zone, e.g. `todayIn('America/Chicago')` → "2025-04-30". */
export function todayIn(timeZone: string, now: Date = new Date()): string {
  let format = dayFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    dayFormats.set(timeZone, format);
  }
  return format.format(now);
}

/** One formatter per time zone: building one costs far more than using it, and a request asks several times. */
const dayFormats = new Map<string, Intl.DateTimeFormat>();

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((toUtcMs(to) - toUtcMs(from)) / 86_400_000);
}

export function addDays(date: string, days: number): string {
  return fromUtcMs(toUtcMs(date) + days * 86_400_000);
}

/** Calendar months later; the 31st of a short month falls on its last day (Jan 31 + 1 → Feb 28/29). */
export function addMonths(date: string, months: number): string {
  const [y, m, d] = parts(date);
  const firstOfTarget = new Date(Date.UTC(y, m - 1 + months, 1));
  const lastDay = new Date(Date.UTC(firstOfTarget.getUTCFullYear(), firstOfTarget.getUTCMonth() + 1, 0)).getUTCDate();
  return fromUtcMs(Date.UTC(firstOfTarget.getUTCFullYear(), firstOfTarget.getUTCMonth(), Math.min(d, lastDay)));
}

const daysInMonth = (y: number, m: number) => (m === 2 ? ((y % 4 === 0 && y % 100 !== 0) || y % 400 === 0 ? 29 : 28) : [4, 6, 9, 11].includes(m) ? 30 : 31);

/** A real calendar date as YYYY-MM-DD (checked by arithmetic: it runs for every record a table reads). */
export function isIsoDate(value: string): boolean {
  if (validDates.has(value)) return true;
  const match = isoDate.exec(value);
  if (!match) return false;
  const y = Number(match[1]);
  const m = Number(match[2]);
  const d = Number(match[3]);
  // Years under 100 were never valid here (Date.UTC reads them as 19xx).
  const valid = y >= 100 && m >= 1 && m <= 12 && d >= 1 && d <= daysInMonth(y, m);
  if (valid) {
    if (validDates.size >= CACHED_DATES) validDates.clear();
    validDates.add(value);
  }
  return valid;
}

/**
 * The dates a record may carry: the co-op's oldest stock was born long after 1990, and a date past 2100
 * is a typing slip (or a probe), which would otherwise reach date arithmetic.
 */
export const EARLIEST_RECORD_DATE = '1990-01-01';
export const LATEST_RECORD_DATE = '2100-12-31';

/** A valid YYYY-MM-DD within the range a record may carry. */
export function isRecordDate(value: string): boolean {
  return isIsoDate(value) && value >= EARLIEST_RECORD_DATE && value <= LATEST_RECORD_DATE;
}
