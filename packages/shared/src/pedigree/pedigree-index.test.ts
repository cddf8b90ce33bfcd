import { describe, expect, it } from 'vitest';
import { inbreedingCoefficients } from './inbreeding';
import { findPedigreeCycle, indexPedigree, PedigreeCycleError, type PedigreeAnimal } from './pedigree-index';

describe('pedigree index', () => {
  it('when a line is 200,000 generations deep and listed offspring first, then it sorts without overflowing the stack', () => {
    const depth = 200_000;
    const rows: PedigreeAnimal[] = [];
    for (let i = depth - 1; i >= 0; i--) rows.push({ id: `L${i}`, sireId: i > 0 ? `L${i - 1}` : null, damId: null });
    const index = indexPedigree(rows);
    expect(index.size).toBe(depth);
    let parentsAfterOffspring = 0;
    for (let p = 0; p < index.size; p++) if (index.sire[p]! >= p) parentsAfterOffspring++;
    expect(parentsAfterOffspring).toBe(0);
    const f = inbreedingCoefficients(rows);
    expect(f.size).toBe(depth);
    expect(f.get('L0')).toBe(0);
  });

  it('when a long cycle is present, then it is reported without throwing through findPedigreeCycle', () => {
    const rows: PedigreeAnimal[] = Array.from({ length: 5000 }, (_, i) => ({ id: `C${i}`, sireId: `C${(i + 1) % 5000}`, damId: null }));
    const cycle = findPedigreeCycle(rows)!;
    expect(cycle).toHaveLength(5001);
    expect(cycle[0]).toBe(cycle[5000]);
    expect(() => indexPedigree(rows)).toThrow(PedigreeCycleError);
    expect(findPedigreeCycle([{ id: 'A', sireId: null, damId: null }])).toBeNull();
  });

  it('when parents are named but not listed, then each is one founder placed before its offspring', () => {
    const index = indexPedigree([
      { id: 'A', sireId: 'OUT', damId: null },
      { id: 'B', sireId: 'OUT', damId: 'OUT2' },
    ]);
    expect(index.size).toBe(4);
    const out = index.positionOf('OUT');
    expect(index.sire[index.positionOf('A')]).toBe(out);
    expect(index.sire[index.positionOf('B')]).toBe(out);
    expect(index.rowOf[out]).toBe(-1);
    expect(index.positionOf('NOBODY')).toBe(-1);
  });
});
