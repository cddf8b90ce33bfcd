import { describe, expect, it } from 'vitest';
import { fitGompertz, gompertzAgeAt, gompertzAgeAtWithError, gompertzGain, gompertzWeight, referenceCurve } from './gompertz';

const curve = { matureGrams: 4800, b: 4.3, k: 0.028 };

describe('the Gompertz curve', () => {
  it('when read at an age and back, then the age is the same; at birth it is A·e^(−b)', () => {
    expect(gompertzAgeAt(gompertzWeight(63, curve), curve)).toBeCloseTo(63, 9);
    expect(gompertzWeight(0, curve)).toBeCloseTo(4800 * Math.exp(-4.3), 9);
    expect(gompertzAgeAt(5000, curve)).toBeNull();
    expect(gompertzAgeAt(10, curve)).toBe(0);
  });

  it('when the gain is read, then it matches the slope of the weights', () => {
    const slope = (gompertzWeight(50.001, curve) - gompertzWeight(49.999, curve)) / 0.002;
    expect(gompertzGain(50, curve)).toBeCloseTo(slope, 4);
  });

  it('when the weigh-ins lie exactly on a curve and run long, then the fit without a prior gives the curve back', () => {
    const points = [0, 14, 28, 42, 56, 70, 98, 140, 200, 280].map((ageDays) => ({ ageDays, grams: gompertzWeight(ageDays, curve) }));
    const fit = fitGompertz(points, { priorMatureGrams: null })!;
    expect(fit.params.matureGrams).toBeCloseTo(4800, 3);
    expect(fit.params.b).toBeCloseTo(4.3, 6);
    expect(fit.params.k).toBeCloseTo(0.028, 7);
    expect(fit.residualLogSe!).toBeLessThan(1e-6);
    expect(fit.df).toBe(4 + points.length - 3);
  });

  it('when exact fryer weigh-ins are fitted with a wrong prior, then the curve still meets them and the target age is near', () => {
    const points = [28, 35, 42, 49, 56].map((ageDays) => ({ ageDays, grams: gompertzWeight(ageDays, curve) }));
    const fit = fitGompertz(points, { priorMatureGrams: 4000 })!;
    for (const p of points) expect(Math.abs(gompertzWeight(p.ageDays, fit.params) / p.grams - 1)).toBeLessThan(0.01);
    const at = gompertzAgeAtWithError(2270, fit)!;
    expect(Math.abs(at.ageDays - gompertzAgeAt(2270, curve)!)).toBeLessThan(2);
    expect(at.se).toBeGreaterThan(0);
  });

  it('when there are fewer than three ages, or a non-positive weight, then there is no fit', () => {
    expect(fitGompertz([{ ageDays: 28, grams: 500 }, { ageDays: 42, grams: 1000 }], { priorMatureGrams: 4500 })).toBeNull();
    expect(fitGompertz([{ ageDays: 28, grams: 500 }, { ageDays: 28, grams: 510 }, { ageDays: 42, grams: 1000 }], { priorMatureGrams: 4500 })).toBeNull();
    expect(fitGompertz([{ ageDays: 28, grams: 0 }, { ageDays: 35, grams: 700 }, { ageDays: 42, grams: 1000 }], { priorMatureGrams: 4500 })).toBeNull();
    expect(fitGompertz([{ ageDays: 28, grams: 500 }, { ageDays: 35, grams: 700 }, { ageDays: 42, grams: 1000 }], { priorMatureGrams: null })).toBeNull();
  });

  it('when the curve levels off below the target, then there is no age for it', () => {
    const points = [28, 42, 56, 70].map((ageDays) => ({ ageDays, grams: gompertzWeight(ageDays, { matureGrams: 2000, b: 3.5, k: 0.04 }) }));
    const fit = fitGompertz(points, { priorMatureGrams: 2000 })!;
    expect(gompertzAgeAtWithError(2270, fit)).toBeNull();
  });

  it('when the reference curve is scaled to a small breed, then its weights scale with the mature weight', () => {
    const small = referenceCurve('small');
    const medium = referenceCurve('medium');
    expect(gompertzWeight(56, small) / gompertzWeight(56, medium)).toBeCloseTo(0.5, 2);
  });
});
