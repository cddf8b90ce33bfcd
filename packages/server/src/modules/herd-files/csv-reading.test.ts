import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { OFF_THREAD_BYTES, parseCsv, readHerdCsv } from './csv-reading';

const options = { bom: true, delimiter: ',', info: true, raw: true, relax_column_count: true, skip_empty_lines: true, trim: true } as const;
const herdText = (rows: number) =>
  ['tattoo,name,sex,breed,born,sire,dam', ...Array.from({ length: rows }, (_, i) => `T${i},"Doe, number ${i}",doe,New Zealand,2024-01-01,,`)].join('\n');

describe('reading a large herd file off the main thread', () => {
  it('when the text is large, then a worker thread parses it to the same rows while the main thread keeps turning', async () => {
    const text = herdText(8000);
    expect(text.length).toBeGreaterThan(OFF_THREAD_BYTES);
    let turns = 0;
    let spinning = true;
    const spin = () => {
      turns++;
      if (spinning) setImmediate(spin);
    };
    setImmediate(spin);
    const result = await parseCsv(text, options);
    spinning = false;
    expect(result.threadId).not.toBe(0);
    expect(turns).toBeGreaterThan(0);
    expect(result.rows).toEqual(parse(text, options));
    expect(result.rows[8000]!.record).toEqual(['T7999', 'Doe, number 7999', 'doe', 'New Zealand', '2024-01-01', '', '']);
  });

  it('when the text is small, then it is parsed at once on this thread (a worker would cost more than the parse)', async () => {
    const result = await parseCsv(herdText(3), options);
    expect(result.threadId).toBe(0);
    expect(result.rows).toHaveLength(4);
  });

  it('when a large file has a quote never closed, then the refusal names the line as for a small file', async () => {
    const text = `${herdText(8000)}\nT9,"Unclosed,doe,New Zealand,2024-01-01,,\n`;
    await expect(readHerdCsv(Buffer.from(text), { maxRows: 20_000 })).rejects.toMatchObject({
      status: 400,
      message: expect.stringMatching(/^The file is not valid CSV near line 800\d: a quoted cell is never closed\./),
    });
  });
});
