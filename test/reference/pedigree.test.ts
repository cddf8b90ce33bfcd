import { describe, expect, it } from 'vitest';
import {
  inbreedingCoefficients, kinship, offspringInbreeding, offspringInbreedingMany, PedigreeCycleError, PedigreeDuplicateError,
  type PedigreeAnimal,
} from '@burrowline/shared';

/** `X = sire × dam` rows; a parent written as `-` is unknown. */
function pedigree(...rows: string[]): PedigreeAnimal[] {
  return rows.map((row) => {
    const [id, parents] = row.split('=').map((part) => part.trim());
    if (!parents) return { id: id!, sireId: null, damId: null };
    const [sireId, damId] = parents.split('×').map((part) => part.trim());
    return { id: id!, sireId: sireId === '-' ? null : sireId!, damId: damId === '-' ? null : damId! };
  });
}

/** F of X from inbreedingCoefficients, which must agree with offspringInbreeding of X's parents. */
function inbreedingOf(animals: PedigreeAnimal[], id = 'X'): number {
  const f = inbreedingCoefficients(animals).get(id)!;
  const row = animals.find((animal) => animal.id === id)!;
  const withoutX = animals.filter((animal) => animal.id !== id);
  expect(offspringInbreeding(withoutX, row.sireId!, row.damId!)).toBeCloseTo(f, 15);
  return f;
}

// Founders (P…, Q…, M…) are not listed: an id named only as a parent is a founder.
describe('inbreeding of offspring by the parents\' relationship (Falconer & Mackay, Introduction to Quantitative Genetics, standard table; Wright 1922 path formula)', () => {
  it('when full sibs are mated, then the litter has F = 1/4', () => {
    expect(inbreedingOf(pedigree('A = P1 × P2', 'B = P1 × P2', 'X = A × B'))).toBe(1 / 4);
  });

  it('when a parent is mated with its offspring, then the litter has F = 1/4', () => {
    expect(inbreedingOf(pedigree('A = P1 × P2', 'X = P1 × A'))).toBe(1 / 4);
  });

  it('when half sibs are mated, then the litter has F = 1/8', () => {
    expect(inbreedingOf(pedigree('A = P1 × M1', 'B = P1 × M2', 'X = A × B'))).toBe(1 / 8);
  });

  it('when an uncle is mated with his niece, then the litter has F = 1/8', () => {
    expect(inbreedingOf(pedigree('A = P1 × P2', 'B = P1 × P2', 'C = B × M1', 'X = A × C'))).toBe(1 / 8);
  });

  it('when double first cousins are mated, then the litter has F = 1/8', () => {
    const animals = pedigree('A = P1 × P2', 'B = P1 × P2', 'C = Q1 × Q2', 'D = Q1 × Q2', 'E = A × C', 'G = B × D', 'X = E × G');
    expect(inbreedingOf(animals)).toBe(1 / 8);
  });

  it('when first cousins are mated, then the litter has F = 1/16', () => {
    expect(inbreedingOf(pedigree('A = P1 × P2', 'B = P1 × P2', 'E = A × M1', 'G = B × M2', 'X = E × G'))).toBe(1 / 16);
  });

  it('when first cousins once removed are mated, then the litter has F = 1/32', () => {
    const animals = pedigree('A = P1 × P2', 'B = P1 × P2', 'E = A × M1', 'G = B × M2', 'H = G × M3', 'X = E × H');
    expect(inbreedingOf(animals)).toBe(1 / 32);
  });

  it('when second cousins are mated, then the litter has F = 1/64', () => {
    const animals = pedigree('A = P1 × P2', 'B = P1 × P2', 'E = A × M1', 'G = B × M2', 'H = E × M3', 'I = G × M4', 'X = H × I');
    expect(inbreedingOf(animals)).toBe(1 / 64);
  });

  it('when half sibs share a parent with F = 0.5, then the litter has F = (1/2)^3 × 1.5 = 0.1875 (derived from Wright 1922)', () => {
    // S comes from three generations of full-sib mating, so F_S = 0.5 (Falconer & Mackay Table 5.1, checked below).
    const animals = pedigree(
      'C = P1 × P2', 'D = P1 × P2', 'E = C × D', 'G = C × D', 'H = E × G', 'I = E × G', 'S = H × I',
      'A = S × M1', 'B = S × M2', 'X = A × B',
    );
    expect(inbreedingCoefficients(animals).get('S')).toBe(0.5);
    expect(inbreedingOf(animals)).toBe(0.1875);
  });

  it('when an animal is both sire and dam (selfing, a test of the arithmetic), then F = (1/2)(1 + F_A) (derived from Wright 1922)', () => {
    const animals = pedigree('A = P1 × P1', 'X = A × A');
    const f = inbreedingCoefficients(animals);
    expect(f.get('A')).toBe(0.5);
    expect(f.get('X')).toBe(0.75);
    expect(offspringInbreeding([], 'Z', 'Z')).toBe(0.5);
  });
});

describe('worked example (Mrode, Linear Models for the Prediction of Animal Breeding Values, 3rd ed., CABI)', () => {
  // 3 = 1 × 2; 4 = 1 × unknown; 5 = 4 × 3; 6 = 5 × 2.
  const mrode = pedigree('1', '2', '3 = 1 × 2', '4 = 1 × -', '5 = 4 × 3', '6 = 5 × 2');

  it('when the six animals are computed, then F5 = 0.125 and F6 = 0.125 and the rest are 0', () => {
    expect(Object.fromEntries(inbreedingCoefficients(mrode))).toEqual({ 1: 0, 2: 0, 3: 0, 4: 0, 5: 0.125, 6: 0.125 });
  });

  it('when the rows come offspring first, then the values are the same', () => {
    expect(Object.fromEntries(inbreedingCoefficients([...mrode].reverse()))).toEqual(Object.fromEntries(inbreedingCoefficients(mrode)));
  });

  it('when 6 is computed as a prospective litter of 5 × 2, then F = 0.125 (kinship of 5 and 2)', () => {
    const withoutSix = mrode.filter((animal) => animal.id !== '6');
    expect(offspringInbreeding(withoutSix, '5', '2')).toBe(0.125);
    expect(kinship(withoutSix, '5', '2')).toBe(0.125);
    expect(kinship(withoutSix, '2', '5')).toBe(0.125);
    // Kinship of an animal with itself is (1 + F) / 2 (Falconer & Mackay, coancestry).
    expect(kinship(mrode, '5', '5')).toBe(0.5625);
  });
});

// Worked out by hand, not read from a published table: F_t = ¼(1 + 2F_{t−1} + F_{t−2}) from F_0 = F_{−1} = 0 gives
// ¼(1) = 0.25, ¼(1 + 0.5) = 0.375, ¼(1 + 0.75 + 0.25) = 0.5, ¼(1 + 1 + 0.375) = 0.59375, ¼(1 + 1.1875 + 0.5) = 0.671875,
// ¼(1 + 1.34375 + 0.59375) = 0.734375. The recurrence is the full-sib one of Falconer & Mackay, Introduction to Quantitative Genetics, ch. 5.
describe('repeated full-sib mating (values worked out by hand from the full-sib recurrence, Falconer & Mackay ch. 5)', () => {
  it('when full sibs are mated for six generations, then F = 0.25, 0.375, 0.5, 0.59375, 0.671875, 0.734375', () => {
    const animals: PedigreeAnimal[] = [];
    let pair: [string, string] = ['G0a', 'G0b'];
    for (let t = 0; t <= 6; t++) {
      const next: [string, string] = [`G${t + 1}a`, `G${t + 1}b`];
      for (const id of next) animals.push({ id, sireId: pair[0], damId: pair[1] });
      pair = next;
    }
    const f = inbreedingCoefficients(animals);
    // Generation 1 are full sibs of unrelated founders (F = 0); their offspring are t = 1.
    const series = [2, 3, 4, 5, 6, 7].map((g) => f.get(`G${g}a`));
    expect(series).toEqual([0.25, 0.375, 0.5, 0.59375, 0.671875, 0.734375]);
    // Recurrence check, derived: F_t = ¼(1 + 2F_{t−1} + F_{t−2}).
    for (let g = 4; g <= 7; g++) {
      expect(f.get(`G${g}a`)).toBe(0.25 * (1 + 2 * f.get(`G${g - 1}a`)! + f.get(`G${g - 2}a`)!));
    }
  });
});

describe('pedigree input rules', () => {
  it('when the rows are shuffled, then every F is the same (order independence)', () => {
    const animals = pedigree(
      'A = P1 × P2', 'B = P1 × P2', 'C = A × B', 'D = A × B', 'E = C × D', 'G = C × M1', 'H = E × G', 'I = H × D',
    );
    const expected = inbreedingCoefficients(animals);
    const orders = [[...animals].reverse(), [4, 0, 7, 2, 6, 1, 5, 3].map((i) => animals[i]!)];
    for (const order of orders) {
      const f = inbreedingCoefficients(order);
      expect(f.size).toBe(animals.length);
      for (const [id, value] of expected) expect(f.get(id)).toBe(value);
    }
  });

  it('when two rows name the same unlisted parent, then it is one founder (half sibs → 1/8, Falconer & Mackay)', () => {
    const animals = pedigree('A = OUT-7 × M1', 'B = OUT-7 × M2', 'X = A × B');
    const f = inbreedingCoefficients(animals);
    expect([...f.keys()]).toEqual(['A', 'B', 'X']); // an entry for each listed animal only
    expect(f.get('X')).toBe(1 / 8);
  });

  it('when a parent is unknown, then that side adds nothing (Mrode: 4 = 1 × unknown)', () => {
    expect(inbreedingCoefficients(pedigree('A = P1 × P2', 'X = A × -')).get('X')).toBe(0);
  });

  it('when the pedigree has a cycle, then the error names an animal in it', () => {
    const animals = pedigree('A = B × M1', 'B = C × M2', 'C = A × M3', 'D = P1 × P2');
    expect(() => inbreedingCoefficients(animals)).toThrow(PedigreeCycleError);
    expect(() => inbreedingCoefficients(animals)).toThrow(/"(A|B|C)" is its own ancestor/);
    let thrown: unknown;
    try {
      offspringInbreeding(animals, 'D', 'A');
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(PedigreeCycleError);
    const cycle = (thrown as PedigreeCycleError).cycle;
    expect(cycle[0]).toBe(cycle[cycle.length - 1]);
    expect(new Set(cycle)).toEqual(new Set(['A', 'B', 'C']));
  });

  it('when an animal is its own parent, then it is a cycle naming that animal', () => {
    expect(() => inbreedingCoefficients(pedigree('A = A × M1'))).toThrow(/"A" is its own parent/);
  });

  it('when an animal is listed twice, then a clear error names it', () => {
    expect(() => inbreedingCoefficients(pedigree('A = P1 × P2', 'A = P1 × P3'))).toThrow(PedigreeDuplicateError);
    expect(() => inbreedingCoefficients(pedigree('A = P1 × P2', 'A = P1 × P3'))).toThrow(/"A" is listed more than once/);
  });

  it('when bucks are ranked for one doe, then each litter F matches offspringInbreeding (half sibs 1/8, full sibs 1/4, unrelated 0)', () => {
    const animals = pedigree('DOE = P1 × P2', 'FULL = P1 × P2', 'HALF = P1 × M1', 'OTHER = Q1 × Q2');
    const f = inbreedingCoefficients(animals);
    for (const precomputed of [undefined, f]) {
      const ranked = offspringInbreedingMany(animals, 'DOE', ['FULL', 'HALF', 'OTHER', 'UNLISTED'], precomputed);
      expect(Object.fromEntries(ranked)).toEqual({ FULL: 1 / 4, HALF: 1 / 8, OTHER: 0, UNLISTED: 0 });
    }
  });
});
