import { describe, expect, it } from 'vitest';
import { CoopPedigree } from './coop-pedigree';
import { rankStuds, sharedAncestors, ancestorDepths } from './stud-ranking';

const known = (breed: string) => ({ breeds: { [breed]: 1 }, unknown: 0, purity: 'purebred' as const });

describe('rankStuds', () => {
  // S sires both the doe D and buck H (half-siblings); F is her dam; full-sibs X and D share S and F.
  const pedigree = CoopPedigree.build([
    { id: 'S', sireId: null, damId: null },
    { id: 'F', sireId: null, damId: null },
    { id: 'D', sireId: 'S', damId: 'F' },
    { id: 'X', sireId: 'S', damId: 'F' },
    { id: 'H', sireId: 'S', damId: null },
    { id: 'U', sireId: null, damId: null },
    { id: 'V', sireId: null, damId: null },
  ]);

  it('when bucks differ in kinship with the doe, then the litter COI is the published value and the lowest leads', () => {
    const ranked = rankStuds(pedigree, { id: 'D', makeup: known('nz') }, [
      { buckId: 'X', label: 'X', makeup: known('nz'), getDailyGainGrams: 50 },
      { buckId: 'H', label: 'H', makeup: known('nz'), getDailyGainGrams: 50 },
      { buckId: 'U', label: 'U', makeup: known('nz'), getDailyGainGrams: null },
    ]);
    expect(ranked.map((r) => r.candidate.buckId)).toEqual(['U', 'H', 'X']);
    // Wright's coefficients: offspring of half-sibs 1/8, of full sibs 1/4 (Falconer & Mackay, 4th ed., ch. 5).
    expect(ranked[1]!.litterCoi).toBeCloseTo(0.125, 12);
    expect(ranked[2]!.litterCoi).toBeCloseTo(0.25, 12);
    expect(ranked[0]!.explanation).toBe('1st: litter COI 0.0 %, the lowest offered; purebred; no growth record for his get yet.');
    expect(ranked[2]!.explanation).toMatch(/^3rd: litter COI 25\.0 %, higher than 2nd's 12\.5 %/);
  });

  it('when COI ties, then a known make-up comes first, then faster growth, then the name', () => {
    const ranked = rankStuds(pedigree, { id: 'D', makeup: known('nz') }, [
      { buckId: 'U', label: 'Unknown', makeup: null, getDailyGainGrams: 60 },
      { buckId: 'V', label: 'Slow', makeup: known('cal'), getDailyGainGrams: 30 },
      { buckId: 'W', label: 'Fast', makeup: known('cal'), getDailyGainGrams: 45 },
    ]);
    expect(ranked.map((r) => r.candidate.label)).toEqual(['Fast', 'Slow', 'Unknown']);
    expect(ranked.map((r) => r.makeupClass)).toEqual(['known_cross', 'known_cross', 'partly_unknown']);
    expect(ranked[1]!.explanation).toBe('2nd: litter COI 0.0 % and a known cross like 1st; his get gain 30 g/day, below 1st\'s 45 g/day.');
  });

  it('when two animals share ancestors, then only the nearest are named', () => {
    expect(sharedAncestors(pedigree, ancestorDepths(pedigree, 'D', 5), 'X')).toEqual(['S', 'F']);
    expect(sharedAncestors(pedigree, ancestorDepths(pedigree, 'D', 5), 'U')).toEqual([]);
  });
});
