import { stringify } from 'csv-stringify/sync';
import { spreadsheetSafe } from '@burrowline/shared';

/** A cell: text, or a number (which cannot carry a formula and stays a number in the spreadsheet). */
export type CsvCell = string | number | null;

/**
 * The one CSV writer of every export: UTF-8 with a byte-order mark and CRLF line ends, as spreadsheets
 * expect, and every text cell made safe here so that no column of any export can carry a formula
 * (OWASP CSV injection: a leading = + - @ tab or CR gets an apostrophe).
 */
export function csvFile(rows: readonly (readonly CsvCell[])[]): string {
  const safe = rows.map((row) => row.map((cell) => (typeof cell === 'number' ? cell : spreadsheetSafe(cell ?? ''))));
  return stringify(safe, { bom: true, record_delimiter: 'windows' });
}
