import { describe, expect, it } from 'vitest';
import { padGrams, pressKey } from './pad-keys';

describe('the weighing pad', () => {
  it('when digits, a point and ⌫ are pressed, then the box reads as typed with at most one decimal where decimals are allowed', () => {
    const typed = ['1', '2', '.', '5', '7'].reduce((t, k) => pressKey(t, k, true), '');
    expect(typed).toBe('12.5');
    expect(pressKey('12.5', '⌫', true)).toBe('12.');
    expect(pressKey('', '.', true)).toBe('0.');
    expect(pressKey('1850', '.', false)).toBe('1850');
    expect(pressKey('0', '7', false)).toBe('7');
    expect(pressKey('12345', '6', false)).toBe('12345');
  });

  it('when pounds and ounces are typed, then the grams follow the international pound of 1959', () => {
    // NIST Handbook 44, Appendix C: 1 lb = 453.59237 g exactly; 1 oz = 28.349523125 g.
    expect(padGrams({ major: '4', minor: '' }, 'lb_oz')).toBe(1814); // 1,814.36948 g
    expect(padGrams({ major: '3', minor: '8' }, 'lb_oz')).toBe(1588); // 1,587.573295 g
    expect(padGrams({ major: '', minor: '10.5' }, 'lb_oz')).toBe(298); // 297.66999 g
    expect(padGrams({ major: '', minor: '1850' }, 'kg_g')).toBe(1850);
    expect(padGrams({ major: '', minor: '' }, 'kg_g')).toBeNull();
  });
});
