import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { settleUp } from './settle-up';

// Greedy matching of the largest debtor with the largest creditor is common practice for settling group debts
// (no published source recorded here); the examples below are worked by hand, and the n − 1 bound follows from
// each payment clearing at least one party, which the property at the end checks on random positions.
describe('settle-up', () => {
  it('when three farms owe one, then each debtor pays the creditor once (worked by hand)', () => {
    const payments = settleUp([
      { farmId: 'a', netCents: 9_000 },
      { farmId: 'b', netCents: -5_000 },
      { farmId: 'c', netCents: -3_000 },
      { farmId: 'd', netCents: -1_000 },
    ]);
    expect(payments).toEqual([
      { fromFarmId: 'b', toFarmId: 'a', amountCents: 5_000 },
      { fromFarmId: 'c', toFarmId: 'a', amountCents: 3_000 },
      { fromFarmId: 'd', toFarmId: 'a', amountCents: 1_000 },
    ]);
  });

  it('when a debtor owes more than the largest creditor is owed, then the rest goes to the next creditor (worked by hand)', () => {
    expect(settleUp([
      { farmId: 'a', netCents: 4_000 },
      { farmId: 'b', netCents: 2_500 },
      { farmId: 'c', netCents: -6_500 },
    ])).toEqual([
      { fromFarmId: 'c', toFarmId: 'a', amountCents: 4_000 },
      { fromFarmId: 'c', toFarmId: 'b', amountCents: 2_500 },
    ]);
  });

  it('when everyone is square, then nobody pays', () => {
    expect(settleUp([{ farmId: 'a', netCents: 0 }, { farmId: 'b', netCents: 0 }])).toEqual([]);
  });

  it('when positions do not sum to zero, then it refuses', () => {
    expect(() => settleUp([{ farmId: 'a', netCents: 1 }])).toThrow(/sum to zero/);
  });

  it('for any balanced positions, the payments clear every farm with at most n − 1 payments, all positive', () => {
    const positions = fc.array(fc.integer({ min: -1_000_000, max: 1_000_000 }), { minLength: 1, maxLength: 30 }).map((amounts) => {
      const rest = amounts.reduce((s, a) => s + a, 0);
      return [...amounts, -rest].map((netCents, i) => ({ farmId: `farm-${i}`, netCents }));
    });
    fc.assert(fc.property(positions, (list) => {
      const payments = settleUp(list);
      const after = new Map(list.map((p) => [p.farmId, p.netCents]));
      for (const p of payments) {
        expect(p.amountCents).toBeGreaterThan(0);
        after.set(p.fromFarmId, after.get(p.fromFarmId)! + p.amountCents);
        after.set(p.toFarmId, after.get(p.toFarmId)! - p.amountCents);
      }
      expect([...after.values()].every((v) => v === 0)).toBe(true);
      const nonZero = list.filter((p) => p.netCents !== 0).length;
      expect(payments.length).toBeLessThanOrEqual(Math.max(0, nonZero - 1));
    }), { numRuns: 500 });
  });
});
