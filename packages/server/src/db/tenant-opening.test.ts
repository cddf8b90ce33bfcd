import { describe, expect, it } from 'vitest';
import { inlineParameters } from './tenant-opening';

const quote = (value: string) => `'${value.replace(/'/g, "''")}'`;

describe('inlineParameters', () => {
  it('when a statement has parameters, then each becomes a quoted literal in its place', () => {
    expect(inlineParameters('SELECT * FROM animals WHERE coop_id = $1 AND id = $2', ['c', "o'hara"], quote)).toBe(
      "SELECT * FROM animals WHERE coop_id = 'c' AND id = 'o''hara'",
    );
  });

  it('when a parameter is used twice or above $9, then every use is replaced', () => {
    const values = Array.from({ length: 11 }, (_, i) => `v${i + 1}`);
    expect(inlineParameters('SELECT $1, $11, $1', values, quote)).toBe("SELECT 'v1', 'v11', 'v1'");
  });

  it('when $n stands in a string, a quoted name, a comment or a dollar-quoted body, then it is left alone', () => {
    const sql = `SELECT '$1', "$1", $$ $1 $$, $body$ $1 $body$ -- $1\n, /* $1 */ $1`;
    expect(inlineParameters(sql, ['x'], quote)).toBe(`SELECT '$1', "$1", $$ $1 $$, $body$ $1 $body$ -- $1\n, /* $1 */ 'x'`);
  });

  it('when a value is null, a number, an array or an object, then it is written as pg would send it', () => {
    expect(inlineParameters('SELECT $1, $2, $3::uuid[], $4::jsonb', [null, 42, ['a', 'b"c'], { k: 1 }], quote)).toBe(
      `SELECT NULL, '42', '{"a","b\\"c"}'::uuid[], '{"k":1}'::jsonb`,
    );
  });

  it('when a value is a date, then it is written in the form pg sends, with its offset', () => {
    const sql = inlineParameters('SELECT $1::timestamptz', [new Date('2024-06-01T12:30:00.000Z')], quote)!;
    const written = /^SELECT '(.*)'::timestamptz$/.exec(sql)![1]!;
    expect(new Date(written.replace(' ', 'T')).toISOString()).toBe('2024-06-01T12:30:00.000Z');
  });

  it('when a value is binary data, or the text ends inside a string, then nothing is inlined', () => {
    expect(inlineParameters('SELECT $1', [Buffer.from('x')], quote)).toBeNull();
    expect(inlineParameters("SELECT 'open", ['x'], quote)).toBeNull();
    expect(inlineParameters('SELECT $2', ['x'], quote)).toBeNull();
  });

  it("when an E'' string escapes its quote with a backslash, then the string still ends where it ends", () => {
    expect(inlineParameters("SELECT E'it\\'s $1', $1", ['x'], quote)).toBe("SELECT E'it\\'s $1', 'x'");
  });
});
