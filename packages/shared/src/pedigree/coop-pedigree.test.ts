import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CoopPedigree } from './coop-pedigree';
import { inbreedingCoefficients, offspringInbreedingMany } from './inbreeding';
import { PedigreeCycleError, type PedigreeAnimal } from './pedigree-index';
import { tabularInbreeding } from './tabular';

/** `X = sire × dam` rows; a parent written as `-` is unknown. */
function pedigree(...rows: string[]): PedigreeAnimal[] {
  return rows.map((row) => {
    const [id, parents] = row.split('=').map((part) => part.trim());
    if (!parents) return { id: id!, sireId: null, damId: null };
    const [sireId, damId] = parents.split('×').map((part) => part.trim());
    return { id: id!, sireId: sireId === '-' ? null : sireId!, damId: damId === '-' ? null : damId! };
  });
}

describe('the co-op pedigree kept in memory, against published values', () => {
  it('when Mrode\'s worked example is built, then F5 = F6 = 0.125 and the rest are 0 (Mrode, Linear Models for the Prediction of Animal Breeding Values, 3rd ed., CABI)', () => {
    const kept = CoopPedigree.build(pedigree('1', '2', '3 = 1 × 2', '4 = 1 × -', '5 = 4 × 3', '6 = 5 × 2'));
    expect(Object.fromEntries(kept.inbreedingAll())).toEqual({ 1: 0, 2: 0, 3: 0, 4: 0, 5: 0.125, 6: 0.125 });
    // 6 = 5 × 2, so a prospective litter of 5 × 2 has F = 0.125; kinship of 5 with itself is (1 + F) / 2.
    expect(kept.offspringInbreedingMany('2', ['5']).get('5')).toBe(0.125);
    expect(kept.kinship('5', '5')).toBe(0.5625);
  });

  it('when one doe is compared with several bucks, then full sib 1/4, half sib 1/8, first cousin 1/16, unrelated 0 (Falconer & Mackay, Introduction to Quantitative Genetics, standard table)', () => {
    const kept = CoopPedigree.build(pedigree('A = P1 × P2', 'B = P1 × P2', 'H = P1 × M1', 'E = A × M2', 'G = B × M3', 'U = Q1 × Q2'));
    // Doe A with her full sib B, half sib H, son E (parent × offspring, 1/4), an unrelated and an unknown buck.
    const litters = kept.offspringInbreedingMany('A', ['B', 'H', 'E', 'U', 'unknown-buck']);
    expect(Object.fromEntries(litters)).toEqual({ B: 0.25, H: 0.125, E: 0.25, U: 0, 'unknown-buck': 0 });
    expect(kept.offspringInbreedingMany('E', ['G']).get('G')).toBe(1 / 16);
  });

  it('when full sibs are mated for six generations and added one litter at a time, then F = 0.25 … 0.734375 (Falconer & Mackay ch. 5 recurrence, worked by hand)', () => {
    const kept = CoopPedigree.build([]);
    let pair: [string, string] = ['G0a', 'G0b'];
    for (let t = 0; t <= 6; t++) {
      const next: [string, string] = [`G${t + 1}a`, `G${t + 1}b`];
      kept.apply(next.map((id) => ({ id, sireId: pair[0], damId: pair[1] })));
      pair = next;
    }
    expect([2, 3, 4, 5, 6, 7].map((g) => kept.inbreeding(`G${g}a`))).toEqual([0.25, 0.375, 0.5, 0.59375, 0.671875, 0.734375]);
  });
});

describe('the co-op pedigree kept in memory, updated in place', () => {
  it('when a parent is corrected, then the animal and its descendants change and everyone else keeps F', () => {
    const rows = pedigree('E = Q1 × Q2', 'A = P1 × P2', 'B = P1 × P2', 'C = A × B', 'D = C × M1');
    const kept = CoopPedigree.build(rows);
    expect(kept.inbreeding('C')).toBe(0.25);
    // C's dam was mistyped: she is from an outside line, so C and her descendants are not inbred.
    const recomputed = kept.apply([{ id: 'C', sireId: 'A', damId: 'E' }]);
    expect(kept.inbreeding('C')).toBe(0);
    expect(recomputed).toBe(2);
    expect(kept.inbreedingAll()).toEqual(inbreedingCoefficients(kept.rows()));
  });

  it('when a change would make an animal its own ancestor, then it is refused and nothing changes', () => {
    const kept = CoopPedigree.build(pedigree('A = P1 × P2', 'B = A × P2', 'C = B × P2'));
    const before = kept.rows();
    expect(() => kept.apply([{ id: 'A', sireId: 'C', damId: 'P2' }])).toThrow(PedigreeCycleError);
    expect(() => kept.apply([{ id: 'N1', sireId: 'N2', damId: null }, { id: 'N2', sireId: 'N1', damId: null }])).toThrow(PedigreeCycleError);
    expect(kept.rows()).toEqual(before);
  });

  it('when an animal is removed (a merged duplicate), then its offspring keep it as a founder named only as a parent', () => {
    const kept = CoopPedigree.build(pedigree('A = P1 × P2', 'B = A × P2', 'C = A × B'));
    kept.apply([], ['A']);
    expect(kept.rows().map((row) => row.id).sort()).toEqual(['B', 'C']);
    expect(kept.inbreedingAll()).toEqual(inbreedingCoefficients(pedigree('B = A × P2', 'C = A × B')));
  });
});

/** A change to a random pedigree: new animals, corrected parents (either order) and removals. */
type Change = { kind: 'add'; count: number; picks: number[] } | { kind: 'reparent'; who: number; sire: number; dam: number } | { kind: 'remove'; who: number };

const changeArbitrary: fc.Arbitrary<Change> = fc.oneof(
  fc.record({ kind: fc.constant('add' as const), count: fc.integer({ min: 1, max: 6 }), picks: fc.array(fc.integer({ min: -8, max: 1000 }), { minLength: 12, maxLength: 12 }) }),
  fc.record({ kind: fc.constant('reparent' as const), who: fc.nat(1000), sire: fc.integer({ min: -8, max: 1000 }), dam: fc.integer({ min: -8, max: 1000 }) }),
  fc.record({ kind: fc.constant('remove' as const), who: fc.nat(1000) }),
);

describe('the co-op pedigree kept in memory, property-based (fast-check)', () => {
  it('when random pedigrees change in random ways, then after every change F equals a full recompute, the tabular method, and the kinship ranking', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -4, max: 60 }), fc.integer({ min: -4, max: 60 })), { minLength: 1, maxLength: 60 }),
        fc.array(changeArbitrary, { maxLength: 8 }),
        (parents, changes) => {
          // Animal i takes parents among the animals before it (a negative pick is an unknown parent).
          const rows: PedigreeAnimal[] = parents.map(([s, d], i) => ({
            id: `a${i}`, sireId: s < 0 || i === 0 ? null : `a${s % i}`, damId: d < 0 || i === 0 ? null : `a${d % i}`,
          }));
          const kept = CoopPedigree.build(rows);
          let next = rows.length;
          for (const change of changes) {
            const current = kept.rows();
            const idOf = (pick: number) => (pick < 0 || current.length === 0 ? null : current[pick % current.length]!.id);
            try {
              if (change.kind === 'add') {
                const added: PedigreeAnimal[] = [];
                for (let k = 0; k < change.count; k++) {
                  const pool = [...current, ...added];
                  const pickOf = (p: number) => (p < 0 || pool.length === 0 ? null : pool[p % pool.length]!.id);
                  added.push({ id: `a${next++}`, sireId: pickOf(change.picks[2 * k]!), damId: pickOf(change.picks[2 * k + 1]!) });
                }
                kept.apply(added);
              } else if (change.kind === 'reparent' && current.length > 0) {
                const who = current[change.who % current.length]!.id;
                const sire = idOf(change.sire);
                const dam = idOf(change.dam);
                kept.apply([{ id: who, sireId: sire === who ? null : sire, damId: dam === who ? null : dam }]);
              } else if (change.kind === 'remove' && current.length > 0) {
                kept.apply([], [current[change.who % current.length]!.id]);
              }
            } catch (error) {
              // A cycle is refused and must leave the pedigree as it was.
              expect(error).toBeInstanceOf(PedigreeCycleError);
              expect(kept.rows()).toEqual(current);
            }
            const full = inbreedingCoefficients(kept.rows());
            const incremental = kept.inbreedingAll();
            expect(incremental.size).toBe(full.size);
            for (const [id, f] of full) expect(incremental.get(id)).toBeCloseTo(f, 12);
            const tabular = tabularInbreeding(kept.rows());
            for (const [id, f] of tabular) expect(incremental.get(id)).toBeCloseTo(f, 12);
            const ids = kept.rows().map((row) => row.id);
            if (ids.length > 1) {
              const ranking = kept.offspringInbreedingMany(ids[0]!, ids);
              const expected = offspringInbreedingMany(kept.rows(), ids[0]!, ids);
              for (const id of ids) expect(ranking.get(id)).toBeCloseTo(expected.get(id)!, 12);
            }
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});
