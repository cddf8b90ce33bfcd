import { describe, expect, it } from 'vitest';
import { centsPerKg, checkFeedUses, costFeedUses, feedCostPerWeight, purchaseGrams, stockLeftByPurchase, type FeedPurchase, type FeedUse } from './feed-cost';
import { doeLitterFeedConversion, feedConversion, groupFeedConversion } from './feed-conversion';
import { dressOut, dressOutPercent } from './dress-out';
import { usdaClass } from './usda-class';
import { randomInt, seededRandom } from '../pedigree/seeded-random';

const purchases: FeedPurchase[] = [
  { id: 'p1', feedId: 'pellets', boughtOn: '2026-05-01', grams: purchaseGrams(22_680, 1), priceCents: 1850 },
  { id: 'p2', feedId: 'pellets', boughtOn: '2026-05-20', grams: 22_680, priceCents: 2000 },
];

describe('feed purchases and uses', () => {
  it('when feed is given before it was bought or more than was left, then each use is refused with the reason', () => {
    const uses: FeedUse[] = [
      { id: 'u0', feedId: 'pellets', givenOn: '2026-04-30', grams: 1000 },
      { id: 'u1', feedId: 'pellets', givenOn: '2026-05-10', grams: 20_000 },
      { id: 'u2', feedId: 'pellets', givenOn: '2026-05-15', grams: 5000 },
      { id: 'u3', feedId: 'hay', givenOn: '2026-05-15', grams: 500 },
      { id: 'u4', feedId: 'pellets', givenOn: '2026-05-16', grams: 0 },
    ];
    expect(checkFeedUses(purchases, uses)).toEqual([
      { useId: 'u0', code: 'before_purchase', message: 'Feed given on 2026-04-30, before it was first bought on 2026-05-01' },
      { useId: 'u2', code: 'more_than_bought', message: '5000 g given on 2026-05-15, but only 2680 g of that feed was left' },
      { useId: 'u4', code: 'not_positive', message: 'Feed given must be above zero grams' },
      { useId: 'u3', code: 'before_purchase', message: 'Feed given on 2026-05-15, but none of it was ever bought' },
    ]);
  });

  it('when uses span two bags at different prices, then each is costed first in first out and the cents add up exactly', () => {
    const uses: FeedUse[] = [
      { id: 'u1', feedId: 'pellets', givenOn: '2026-05-10', grams: 10_000 },
      { id: 'u2', feedId: 'pellets', givenOn: '2026-05-21', grams: 20_000 }, // 12,680 g of bag 1 + 7,320 g of bag 2
      { id: 'u3', feedId: 'pellets', givenOn: '2026-05-30', grams: 15_360 }, // the rest of bag 2
    ];
    const cost = costFeedUses(purchases, uses);
    expect(cost.get('u1')).toBe(Math.round((10_000 * 1850) / 22_680)); // 815.7 → 816
    expect([...cost.values()].reduce((s, c) => s + c, 0)).toBe(1850 + 2000);
  });

  it('when a $10.00 bag is given in three equal thirds, then the uses cost 333, 334 and 333 cents, not 999 in all', () => {
    const bag: FeedPurchase[] = [{ id: 'bag', feedId: 'mix', boughtOn: '2026-06-01', grams: 3000, priceCents: 1000 }];
    const thirds: FeedUse[] = ['u1', 'u2', 'u3'].map((id, i) => ({ id, feedId: 'mix', givenOn: `2026-06-0${i + 2}`, grams: 1000 }));
    expect([...costFeedUses(bag, thirds).values()]).toEqual([333, 334, 333]);
  });

  it('when one purchase is used up in any split (seeded), then the cents of its uses add up exactly to its price', () => {
    const random = seededRandom(20260601);
    for (let round = 0; round < 300; round++) {
      const grams = purchaseGrams(randomInt(random, 1, 25_000), randomInt(random, 1, 6));
      const priceCents = randomInt(random, 0, 250_000);
      const cuts = new Set<number>();
      const parts = randomInt(random, 1, Math.min(25, grams));
      while (cuts.size < parts - 1) cuts.add(randomInt(random, 1, grams - 1));
      const bounds = [0, ...[...cuts].sort((a, b) => a - b), grams];
      const uses: FeedUse[] = bounds.slice(1).map((end, i) => ({
        id: `u${String(i).padStart(2, '0')}`, feedId: 'pellets', givenOn: '2026-06-02', grams: end - bounds[i]!,
      }));
      const cost = costFeedUses([{ id: 'p', feedId: 'pellets', boughtOn: '2026-06-01', grams, priceCents }], uses);
      const total = [...cost.values()].reduce((sum, c) => sum + c, 0);
      expect(total, `${priceCents} cents over ${grams} g in ${parts} uses`).toBe(priceCents);
      for (const c of cost.values()) expect(Number.isInteger(c) && c >= 0).toBe(true);
    }
  });

  it('when costs are asked of impossible uses, then it throws', () => {
    expect(() => costFeedUses(purchases, [{ id: 'u', feedId: 'pellets', givenOn: '2026-04-01', grams: 1 }])).toThrow(RangeError);
  });

  it('when a purchase is not whole bags or a cost is not whole cents, then it is refused', () => {
    expect(() => purchaseGrams(22_680, 0)).toThrow('Buy at least one whole bag');
    expect(() => centsPerKg(10.5, 1000)).toThrow(RangeError);
    expect(() => centsPerKg(100, 0)).toThrow(RangeError);
    expect(feedCostPerWeight({ feedCostCents: 100, liveGrams: 0, carcassGrams: null })).toMatchObject({ perKgLive: null, perKgCarcass: null });
  });
});

describe('feed conversion, dress-out and class edge cases', () => {
  it('when there is no gain, then there is no ratio; negative feed is refused', () => {
    expect(feedConversion(1000, 0)).toBeNull();
    expect(groupFeedConversion({ feedGrams: 1000, startTotalGrams: 5000, endTotalGrams: 4800 })).toEqual({ gainGrams: -200, ratio: null });
    expect(() => feedConversion(-1, 100)).toThrow('Feed must be 0 or more grams');
    expect(() => doeLitterFeedConversion({ feedGrams: 100, youngLiveGrams: -5 })).toThrow(RangeError);
  });

  it('when weights are missing or not positive, then dress-out is refused', () => {
    expect(() => dressOutPercent(1200, 0)).toThrow(RangeError);
    expect(dressOut({ liveGrams: -1, hotCarcassGrams: 1200 })).toMatchObject({ invalid: true, flags: [{ code: 'not_positive', field: 'liveGrams' }] });
    expect(dressOut({ liveGrams: 2270, chilledCarcassGrams: 0 })).toMatchObject({ invalid: true, flags: [{ field: 'chilledCarcassGrams' }] });
    expect(dressOut({ liveGrams: 2270 })).toEqual({ hotPercent: null, chilledPercent: null, chillLossPercent: null, flags: [], invalid: false });
  });

  it('when the chilled carcass weighs more than the hot one, then it is questioned', () => {
    expect(dressOut({ liveGrams: 2270, hotCarcassGrams: 1249, chilledCarcassGrams: 1270 }).flags.map((f) => f.code)).toEqual(['chilled_heavier_than_hot']);
  });

  it('when the age is unknown or processing precedes birth, then the class says so or is refused', () => {
    expect(usdaClass({ birthDate: null, processedOn: '2026-05-01', carcassGrams: 1200 })).toMatchObject({ usdaClass: 'unclassed', ageDays: null });
    expect(() => usdaClass({ birthDate: '2026-05-02', processedOn: '2026-05-01', carcassGrams: 1200 })).toThrow(RangeError);
    expect(() => usdaClass({ birthDate: '2026-03-01', processedOn: '2026-05-01', carcassGrams: 0 })).toThrow(RangeError);
  });
});

describe('stock left in each purchase', () => {
  it('when two bags of one feed are drawn first bought first used, then the older empties first (worked by hand)', () => {
    const purchases: FeedPurchase[] = [
      { id: 'a', feedId: 'grower', boughtOn: '2026-01-01', grams: 22_680, priceCents: 1800 },
      { id: 'b', feedId: 'grower', boughtOn: '2026-01-20', grams: 22_680, priceCents: 2000 },
      { id: 'c', feedId: 'hay', boughtOn: '2026-01-01', grams: 10_000, priceCents: 900 },
    ];
    const uses: FeedUse[] = [
      { id: 'u1', feedId: 'grower', givenOn: '2026-01-10', grams: 20_000 },
      { id: 'u2', feedId: 'grower', givenOn: '2026-01-25', grams: 5_000 },
    ];
    const left = stockLeftByPurchase(purchases, uses);
    // 22,680 − 20,000 = 2,680 left in a; u2 takes those 2,680 then 2,320 of b → 20,360 left in b.
    expect(Object.fromEntries(left)).toEqual({ a: 0, b: 20_360, c: 10_000 });
  });
});
