import { describe, expect, it } from 'vitest';
import { countOf } from './count-of';

describe('counts in words', () => {
  it('when there is one, then the noun is singular; otherwise plural, with thousands grouped', () => {
    expect(countOf(1, 'day')).toBe('1 day');
    expect(countOf(0, 'day')).toBe('0 days');
    expect(countOf(21, 'day')).toBe('21 days');
    expect(countOf(1, 'animal')).toBe('1 animal');
    expect(countOf(2, 'row')).toBe('2 rows');
    expect(countOf(1200, 'kit')).toBe('1,200 kits');
    expect(countOf(3, 'head', 'head')).toBe('3 head');
  });
});
