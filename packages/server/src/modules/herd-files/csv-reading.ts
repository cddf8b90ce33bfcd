import { createHash } from 'node:crypto';
import { Worker } from 'node:worker_threads';
import { parse, CsvError, type Options } from 'csv-parse/sync';
import { fileTypeFromBuffer } from 'file-type';
import { ErrorCode, type ImportRecord } from '@burrowline/shared';
import { AppError } from '../../lib/app-error';

export interface ReadCsv {
  checksum: string;
  hadByteOrderMark: boolean;
  header: string[];
  records: ImportRecord[];
}

const UTF8_BOM = [0xef, 0xbb, 0xbf];

function refuse(message: string, status = 400, code: (typeof ErrorCode)[keyof typeof ErrorCode] = ErrorCode.validation): AppError {
  return new AppError(code, status, message, { file: [message] });
}

function startsWith(buffer: Buffer, bytes: number[]): boolean {
  return bytes.every((byte, i) => buffer[i] === byte);
}

type ParsedRow = { record: string[]; raw: string; info: { lines: number } };

/** Files from this size on are parsed in a worker thread: a 20,000-row file held the event loop over a second. */
export const OFF_THREAD_BYTES = 256 * 1024;

/** A CSV syntax error reported by the worker (the parser's own error class does not cross threads). */
class CsvSyntaxError extends Error {
  constructor(readonly code: string, message: string, readonly lines: number | undefined) {
    super(message);
  }
}

/**
 * Parses CSV text, in a worker thread when it is large so other requests are answered meanwhile; small
 * files are parsed here, where starting a thread would cost more than the parse. Says which thread did it.
 */
export async function parseCsv(text: string, options: Options): Promise<{ rows: ParsedRow[]; threadId: number }> {
  if (text.length < OFF_THREAD_BYTES) return { rows: parse(text, options) as unknown as ParsedRow[], threadId: 0 };
  const worker = new Worker(new URL('./csv-parse-worker.mjs', import.meta.url), { workerData: { text, options } });
  try {
    const answer = await new Promise<{ rows?: ParsedRow[]; csvError?: { code: string; message: string; lines?: number }; failure?: string; threadId: number }>((resolve, reject) => {
      worker.once('message', resolve);
      worker.once('error', reject);
      worker.once('exit', (code) => reject(new Error(`The CSV worker stopped (exit code ${code}) before answering`)));
    });
    if (answer.csvError) throw new CsvSyntaxError(answer.csvError.code, answer.csvError.message, answer.csvError.lines);
    if (answer.failure !== undefined || !answer.rows) throw new Error(`The CSV worker failed: ${answer.failure ?? 'no rows'}`);
    return { rows: answer.rows, threadId: answer.threadId };
  } finally {
    await worker.terminate();
  }
}

/**
 * Turns an uploaded file into the header and the data rows of a CSV, or refuses it with a message
 * that says what it is instead: empty, a spreadsheet or other binary file (told by its signature),
 * UTF-16, not UTF-8, not valid CSV (an unclosed quote, with its line), or too many rows. UTF-8 with
 * or without a byte-order mark reads the same. Semicolon-separated files (a spreadsheet's export in
 * some locales) are read too.
 */
export async function readHerdCsv(buffer: Buffer, opts: { maxRows: number }): Promise<ReadCsv> {
  const checksum = createHash('sha256').update(buffer).digest('hex');
  if (buffer.length === 0) throw refuse('The file is empty');
  if (startsWith(buffer, [0xff, 0xfe]) || startsWith(buffer, [0xfe, 0xff])) {
    throw refuse('The file is saved as UTF-16 text; save it as CSV (UTF-8) and upload it again.', 415, ErrorCode.unsupportedFile);
  }
  const detected = await fileTypeFromBuffer(buffer);
  if (detected) {
    const spreadsheet = ['xlsx', 'xls', 'ods', 'cfb', 'zip'].includes(detected.ext);
    throw refuse(
      spreadsheet
        ? `This is a spreadsheet workbook (${detected.ext.toUpperCase()}), not a CSV file. In your spreadsheet choose "Save as" or "Download" → CSV (UTF-8), then upload that.`
        : `This is a ${detected.ext.toUpperCase()} file, not a CSV file. Upload the herd as CSV (UTF-8) text.`,
      415,
      ErrorCode.unsupportedFile,
    );
  }
  if (buffer.includes(0)) throw refuse('This is not a text file, so not a CSV file. Upload the herd as CSV (UTF-8) text.', 415, ErrorCode.unsupportedFile);
  const hadByteOrderMark = startsWith(buffer, UTF8_BOM);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(buffer);
  } catch {
    throw refuse('The file is not UTF-8 text (perhaps Windows-1252 or Latin-1). In your spreadsheet save it as "CSV UTF-8" and upload it again.', 415, ErrorCode.unsupportedFile);
  }
  // One kind of line end, so line numbers count the same for files from any system.
  text = text.replace(/\r\n?/g, '\n');
  const firstLine = text.slice(0, text.search(/\n|$/));
  const delimiter = !firstLine.includes(',') && firstLine.includes(';') ? ';' : firstLine.includes(',') ? ',' : firstLine.includes('\t') ? '\t' : ',';

  let parsed: ParsedRow[];
  try {
    parsed = (await parseCsv(text, { bom: true, delimiter, info: true, raw: true, relax_column_count: true, skip_empty_lines: true, trim: true })).rows;
  } catch (error) {
    if (error instanceof CsvError || error instanceof CsvSyntaxError) {
      const line = (error as { lines?: number }).lines;
      const where = line ? ` near line ${line}` : '';
      const what = error.code === 'CSV_QUOTE_NOT_CLOSED' ? 'a quoted cell is never closed' : 'a quote is misplaced';
      throw refuse(`The file is not valid CSV${where}: ${what}. Check the quotes (") in that line, or save the file again from your spreadsheet as CSV.`);
    }
    throw error;
  }
  const [first, ...rest] = parsed;
  if (!first) throw refuse('The file has no lines; its first line must name the columns tattoo,name,sex,breed,born,sire,dam');
  if (rest.length > opts.maxRows) {
    throw refuse(`The file has ${rest.length.toLocaleString('en-US')} rows; import at most ${opts.maxRows.toLocaleString('en-US')} at a time (split the file).`, 413, ErrorCode.payloadTooLarge);
  }
  // `info.lines` is where a record ends; a quoted cell may span lines, so count back to where it starts
  // (the raw text begins with any blank lines skipped before it and ends with its own line end).
  const records = rest.map(({ record, raw, info }) => ({
    line: info.lines - (raw.replace(/^\n+/, '').replace(/\n$/, '').match(/\n/g)?.length ?? 0),
    cells: record,
  }));
  return { checksum, hadByteOrderMark, header: first.record, records };
}
