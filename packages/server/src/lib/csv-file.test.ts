import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { csvFile } from './csv-file';

describe('csvFile', () => {
  it('when a text cell starts like a formula (= + - @ tab CR), then it gets a leading apostrophe; other text and numbers are left alone', () => {
    const text = csvFile([
      ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h', 'i'],
      ['=1+1', '+SUM(A1)', '-2', '@cmd', '\tTab', '\rCR', "O'Neil", -2.5, null],
    ]);
    expect(text.startsWith('\ufeff')).toBe(true);
    expect(text).toContain('\r\n');
    const [row] = parse(text, { bom: true, columns: true, relax_quotes: true }) as Record<string, string>[];
    expect(row).toEqual({ a: "'=1+1", b: "'+SUM(A1)", c: "'-2", d: "'@cmd", e: "'\tTab", f: "'\rCR", g: "O'Neil", h: '-2.5', i: '' });
  });
});
