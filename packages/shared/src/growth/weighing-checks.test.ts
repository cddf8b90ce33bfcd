import { describe, expect, it } from 'vitest';
import { checkLiveWeightAgainstLast, checkRoundWeight, expectedBandForAge, projectWeight } from './weighing-checks';

describe('weighing checks', () => {
  it('when the band is asked for at 8 weeks, then it centres on the published 8-week weight', () => {
    // Rao et al. 1977, J. Anim. Sci. 44:1021: 1,644 g at 56 days (the reference curve passes through it).
    expect(expectedBandForAge(56)).toEqual({ lowGrams: 986, expectedGrams: 1644, highGrams: 2630 });
    expect(expectedBandForAge(null)).toBeNull();
  });

  it('when a weight is a tenth or more below the last one, then it is questioned; a smaller loss is not (common practice)', () => {
    const last = { gramsPerHead: 2000, weighedOn: '2026-03-01', ageDays: 70 };
    expect(checkRoundWeight({ gramsPerHead: 1790, ageDays: 77, last, weighedOn: '2026-03-08' })).toEqual({ level: 'warning', message: '1790 g is 210 g less than on 2026-03-01 (2000 g)' });
    expect(checkRoundWeight({ gramsPerHead: 1850, ageDays: 77, last, weighedOn: '2026-03-08' })).toBeNull();
    expect(checkRoundWeight({ gramsPerHead: 25_000, ageDays: 77, last: null, weighedOn: '2026-03-08' })?.level).toBe('error');
  });

  it('when the last weight is carried forward, then an animal of unknown age holds it and a young one grows along the curve', () => {
    expect(projectWeight({ gramsPerHead: 3000, weighedOn: '2026-03-01', ageDays: null }, '2026-03-15')).toBe(3000);
    expect(projectWeight({ gramsPerHead: 1644, weighedOn: '2026-03-01', ageDays: 56 }, '2026-03-15')).toBeGreaterThan(1644);
    expect(checkLiveWeightAgainstLast({ liveGramsPerHead: 3000, processedOn: '2026-03-15', last: { gramsPerHead: 3000, weighedOn: '2026-03-01', ageDays: null } })).toBeNull();
    // A quarter lighter is the edge (common practice): 2,250 g passes, 2,240 g is questioned.
    expect(checkLiveWeightAgainstLast({ liveGramsPerHead: 2250, processedOn: '2026-03-15', last: { gramsPerHead: 3000, weighedOn: '2026-03-01', ageDays: null } })).toBeNull();
    expect(checkLiveWeightAgainstLast({ liveGramsPerHead: 2240, processedOn: '2026-03-15', last: { gramsPerHead: 3000, weighedOn: '2026-03-01', ageDays: null } })?.projectedGrams).toBe(3000);
  });
});
