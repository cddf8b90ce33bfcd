import { describe, expect, it } from 'vitest';
import { pedigreeCompleteness, pedigreeCompletenessAll } from './completeness';
import type { PedigreeAnimal } from './pedigree-index';

// Completeness per generation = known ancestor places / 2^g (common practice in pedigree analysis).
const herd: PedigreeAnimal[] = [
  { id: 'KIT', sireId: 'BUCK', damId: 'DOE' },
  { id: 'BUCK', sireId: 'GS', damId: 'GD' },
  { id: 'DOE', sireId: 'GS', damId: null }, // GS is a grandsire on both sides
  { id: 'GS', sireId: null, damId: 'GGD' }, // GGD: named on papers, not listed
  { id: 'GD', sireId: null, damId: null },
  { id: 'LONE', sireId: null, damId: null },
];

describe('pedigree completeness', () => {
  it('when some ancestors are missing, then each generation shows the fraction of known places', () => {
    // gen 1: BUCK, DOE (2/2); gen 2: GS, GD, GS, unknown (3/4); gen 3: GGD twice (2/8); gen 4: none.
    expect(pedigreeCompleteness(herd, 'KIT')).toEqual([1, 0.75, 0.25, 0]);
  });

  it('when the animal has no parents or is not in the pedigree, then nothing is known', () => {
    expect(pedigreeCompleteness(herd, 'LONE', 3)).toEqual([0, 0, 0]);
    expect(pedigreeCompleteness(herd, 'NOBODY', 2)).toEqual([0, 0]);
  });

  it('when the whole herd is computed at once, then each animal matches the single computation', () => {
    const all = pedigreeCompletenessAll(herd, 5);
    for (const animal of herd) expect(all.get(animal.id)).toEqual(pedigreeCompleteness(herd, animal.id, 5));
  });

  it('when generations is not a whole number, then it is refused', () => {
    expect(() => pedigreeCompleteness(herd, 'KIT', 1.5)).toThrow(RangeError);
  });
});
