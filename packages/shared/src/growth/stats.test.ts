import { describe, expect, it } from 'vitest';
import { incompleteBeta, invert, solveLinear, studentTCdf, studentTQuantile } from './stats';

describe('numerics for the growth model', () => {
  // Student t critical values as tabled in the NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2
  // (upper critical values of the t distribution); the CDF test below checks the quantiles the other way round.
  it('when Student t quantiles are asked, then they match the table to 3 decimals', () => {
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
    expect(studentTQuantile(0.95, 4)).toBeCloseTo(2.132, 3);
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(studentTQuantile(0.95, 30)).toBeCloseTo(1.697, 3);
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(1.96, 2);
    expect(studentTQuantile(0.05, 4)).toBeCloseTo(-2.132, 3);
  });

  it('when the t CDF is read at a quantile, then it gives the probability back', () => {
    for (const df of [1, 2, 5, 17]) expect(studentTCdf(studentTQuantile(0.9, df), df)).toBeCloseTo(0.9, 9);
    expect(studentTCdf(0, 3)).toBeCloseTo(0.5, 12);
  });

  it('when the incomplete beta has a closed form, then it agrees: I_x(1, 1) = x and I_x(2, 1) = x²', () => {
    expect(incompleteBeta(0.3, 1, 1)).toBeCloseTo(0.3, 12);
    expect(incompleteBeta(0.3, 2, 1)).toBeCloseTo(0.09, 12);
    expect(incompleteBeta(0, 2, 3)).toBe(0);
    expect(incompleteBeta(1, 2, 3)).toBe(1);
  });

  it('when a quantile is asked outside (0, 1) or with no degrees of freedom, then it is refused', () => {
    expect(() => studentTQuantile(1, 3)).toThrow(RangeError);
    expect(() => studentTQuantile(0.9, 0)).toThrow(RangeError);
  });

  it('when a small system is solved or inverted, then A·x = b; a singular one gives null', () => {
    expect(solveLinear([[2, 1], [1, 3]], [3, 5])!.map((v) => Number(v.toFixed(12)))).toEqual([0.8, 1.4]);
    const inv = invert([[4, 7], [2, 6]])!;
    expect(inv.flat().map((v) => Number(v.toFixed(12)))).toEqual([0.6, -0.7, -0.2, 0.4]);
    expect(solveLinear([[1, 2], [2, 4]], [1, 2])).toBeNull();
  });
});
