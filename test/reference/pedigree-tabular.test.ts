import { describe, expect, it } from 'vitest';
import {
  inbreedingCoefficients, kinship, offspringInbreeding, offspringInbreedingMany, recomputeInbreeding, type PedigreeAnimal,
} from '@burrowline/shared';
// Test-only helpers that are not part of the package's public exports.
import { additiveRelationshipMatrix, tabularInbreeding, tabularKinship } from '../../packages/shared/src/pedigree/tabular';
import { pick, randomInt, seededRandom, shuffled, type Random } from '../../packages/shared/src/pedigree/seeded-random';

const PEDIGREES = 300;
const TOLERANCE = 1e-12;
const SEED = 20240601;

/**
 * A random pedigree of 2–60 animals built forwards in time: parents are mostly recent animals (so
 * inbreeding runs deep), sometimes any earlier one, sometimes unknown, sometimes an unlisted founder
 * shared by several rows, now and then the same animal as sire and dam; listed in shuffled order.
 */
function randomPedigree(random: Random): PedigreeAnimal[] {
  const n = randomInt(random, 2, 60);
  const outside = ['OUT-1', 'OUT-2', 'OUT-3'];
  const rows: PedigreeAnimal[] = [];
  const parent = (i: number): string | null => {
    const roll = random();
    if (i === 0 || roll < 0.12) return null;
    if (roll < 0.2) return pick(random, outside);
    const recent = roll < 0.75 ? Math.max(0, i - 5) : 0;
    return `a${randomInt(random, recent, i - 1)}`;
  };
  for (let i = 0; i < n; i++) {
    const sireId = parent(i);
    const damId = sireId !== null && random() < 0.04 ? sireId : parent(i);
    rows.push({ id: `a${i}`, sireId, damId });
  }
  return shuffled(random, rows);
}

describe('fast algorithm (Meuwissen & Luo 1992) against the tabular method (additive relationship matrix, F_X = a_sire,dam / 2)', () => {
  it(`when ${PEDIGREES} random pedigrees of 2–60 animals are computed both ways, then every F agrees to 1e-12`, () => {
    const random = seededRandom(SEED);
    let deepest = 0;
    let withSharedAncestors = 0;
    for (let k = 0; k < PEDIGREES; k++) {
      const animals = randomPedigree(random);
      const fast = inbreedingCoefficients(animals);
      const tabular = tabularInbreeding(animals);
      expect(fast.size, `pedigree ${k}`).toBe(animals.length);
      let inbred = false;
      for (const animal of animals) {
        const f = fast.get(animal.id)!;
        expect(Math.abs(f - tabular.get(animal.id)!), `pedigree ${k} (seed ${SEED}), animal ${animal.id}`).toBeLessThan(TOLERANCE);
        deepest = Math.max(deepest, f);
        if (f > 0) inbred = true;
      }
      if (inbred) withSharedAncestors++;
    }
    // The generator must really exercise shared ancestors and deep inbreeding.
    expect(withSharedAncestors).toBeGreaterThan(PEDIGREES / 2);
    expect(deepest).toBeGreaterThan(0.6);
  });

  it(`when kinship and prospective-litter F are computed for random pairs in ${PEDIGREES} pedigrees, then they agree with a_xy / 2 to 1e-12`, () => {
    const random = seededRandom(SEED + 1);
    for (let k = 0; k < PEDIGREES; k++) {
      const animals = randomPedigree(random);
      const matrix = additiveRelationshipMatrix(animals);
      const precomputed = inbreedingCoefficients(animals);
      // Listed animals, unlisted founders named as parents, and an id the pedigree does not know.
      const candidates = [...matrix.ids, 'NOBODY'];
      for (let pair = 0; pair < 8; pair++) {
        const a = pick(random, candidates);
        const b = random() < 0.1 ? a : pick(random, candidates);
        const expected = tabularKinship(matrix, a, b);
        const where = `pedigree ${k} (seed ${SEED + 1}), ${a} × ${b}`;
        expect(Math.abs(kinship(animals, a, b) - expected), where).toBeLessThan(TOLERANCE);
        expect(Math.abs(offspringInbreeding(animals, a, b) - expected), where).toBeLessThan(TOLERANCE);
        expect(Math.abs(offspringInbreeding(animals, a, b, precomputed) - expected), where).toBeLessThan(TOLERANCE);
      }
      const dam = pick(random, candidates);
      const sires = Array.from({ length: 6 }, () => pick(random, candidates));
      for (const precomputedF of [undefined, precomputed]) {
        const ranked = offspringInbreedingMany(animals, dam, sires, precomputedF);
        for (const sire of sires) {
          expect(Math.abs(ranked.get(sire)! - tabularKinship(matrix, sire, dam)), `pedigree ${k}, ${sire} × ${dam}`).toBeLessThan(TOLERANCE);
        }
      }
    }
  });

  it('when a listed animal is removed and recomputed as a prospective litter of its parents, then the F is the same', () => {
    const random = seededRandom(SEED + 2);
    for (let k = 0; k < 100; k++) {
      const animals = randomPedigree(random);
      const f = inbreedingCoefficients(animals);
      const parentIds = new Set(animals.flatMap((animal) => [animal.sireId, animal.damId]));
      const leaves = animals.filter((animal) => !parentIds.has(animal.id) && animal.sireId !== null && animal.damId !== null);
      for (const leaf of leaves) {
        const rest = animals.filter((animal) => animal !== leaf);
        expect(Math.abs(offspringInbreeding(rest, leaf.sireId!, leaf.damId!) - f.get(leaf.id)!)).toBeLessThan(TOLERANCE);
      }
    }
  });

  it('when a parent is changed and a litter added, then recomputing only the affected animals matches the tabular method', () => {
    const random = seededRandom(SEED + 3);
    for (let k = 0; k < 150; k++) {
      const before = randomPedigree(random);
      const stored = inbreedingCoefficients(before);
      // Change one animal's sire to an older animal (a{j} with j < i keeps the pedigree acyclic).
      const order = (id: string) => Number(id.slice(1));
      const target = pick(random, before);
      const i = order(target.id);
      const newSire = i > 0 ? `a${randomInt(random, 0, i - 1)}` : null;
      const after = before.map((animal) => (animal === target ? { ...animal, sireId: newSire } : animal));
      // A new litter of two kits out of two random listed animals.
      const sire = pick(random, before).id;
      const dam = pick(random, before).id;
      after.push({ id: 'kit1', sireId: sire, damId: dam }, { id: 'kit2', sireId: sire, damId: dam });

      const changed = recomputeInbreeding(after, stored, [target.id]);
      expect(changed.has(target.id) && changed.has('kit1') && changed.has('kit2'), `pedigree ${k}`).toBe(true);
      const merged = new Map([...stored, ...changed]);
      const tabular = tabularInbreeding(after);
      expect(merged.size).toBe(after.length);
      for (const animal of after) {
        expect(Math.abs(merged.get(animal.id)! - tabular.get(animal.id)!), `pedigree ${k} (seed ${SEED + 3}), ${animal.id}`).toBeLessThan(TOLERANCE);
      }
      // Only the changed animal, its descendants and the new kits are returned.
      const descendants = new Set([target.id]);
      for (let grew = true; grew; ) {
        grew = false;
        for (const animal of after) {
          if (!descendants.has(animal.id) && [animal.sireId, animal.damId].some((p) => p !== null && descendants.has(p))) {
            descendants.add(animal.id);
            grew = true;
          }
        }
      }
      descendants.add('kit1').add('kit2');
      expect(new Set(changed.keys())).toEqual(descendants);
    }
  });
});
