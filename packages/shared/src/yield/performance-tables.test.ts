import { describe, expect, it } from 'vitest';
import { performanceTables, type PerformanceInput } from './performance-tables';

// A small farm worked out by hand (invented records): two does' litters grow out in one group, and one
// kit kept back is processed later on its own.
//   Doe A (New Zealand) × buck X (Californian): kindled 2026-01-01, 6 born alive, 6 weaned 2026-02-05.
//   Doe B (New Zealand) × buck Y (New Zealand): kindled 2026-01-03, 4 born alive, 4 weaned 2026-02-07.
//   Group G: A's 6 + B's 4 = 10 heads, formed 2026-02-07; weighed 7,000 g then 18,200 g 28 days later;
//   fed 52,000 g; processed 2026-03-10: 20,000 g live, 11,000 g hot carcass.
//   Kit K (X × A, born 2026-01-01): processed alone 2026-06-01, 3,000 g live, 1,650 g hot carcass.
const base: PerformanceInput = {
  today: '2026-12-31',
  period: { from: '2026-01-01', to: '2026-12-31' },
  animals: [
    { id: 'A', name: 'A', tattoo: null, sex: 'doe', breedName: 'New Zealand', onFarm: true },
    { id: 'B', name: 'B', tattoo: null, sex: 'doe', breedName: 'New Zealand', onFarm: true },
    { id: 'X', name: 'X', tattoo: null, sex: 'buck', breedName: 'Californian', onFarm: true },
    { id: 'Y', name: 'Y', tattoo: null, sex: 'buck', breedName: 'New Zealand', onFarm: true },
  ],
  services: [],
  litters: [
    { id: 'LA', damId: 'A', sireId: 'X', kindledOn: '2026-01-01', weaningWeightGrams: 4200, record: { id: 'LA', kindledOn: '2026-01-01', bornAlive: 6, bornDead: 0, events: [{ kind: 'weaned', on: '2026-02-05', count: 6 }] } },
    { id: 'LB', damId: 'B', sireId: 'Y', kindledOn: '2026-01-03', weaningWeightGrams: 2800, record: { id: 'LB', kindledOn: '2026-01-03', bornAlive: 4, bornDead: 0, events: [{ kind: 'weaned', on: '2026-02-07', count: 4 }] } },
  ],
  groups: [{
    id: 'G', name: 'G', formedOn: '2026-02-07', status: 'closed', closedOn: '2026-03-10', targetGrams: 2270,
    litters: [{ litterId: 'LA', heads: 6, kindledOn: '2026-01-01' }, { litterId: 'LB', heads: 4, kindledOn: '2026-01-03' }],
    weighIns: [{ weighedOn: '2026-02-07', totalGrams: 7000, headCount: 10 }, { weighedOn: '2026-03-07', totalGrams: 18200, headCount: 10 }],
    feedGrams: 52000, feedCostCents: 5200,
  }],
  doeLitterFeed: new Map(),
  processing: [
    { id: 'P1', processedOn: '2026-03-10', animalId: null, groupId: 'G', headCount: 10, liveGrams: 20000, hotCarcassGrams: 11000 },
    { id: 'P2', processedOn: '2026-06-01', animalId: 'K', groupId: null, headCount: 1, liveGrams: 3000, hotCarcassGrams: 1650 },
  ],
  processedAnimals: new Map([['K', { sireId: 'X', damId: 'A', birthDate: '2026-01-01' }]]),
};
const years = 365 / 365.25; // doe A: in production from her litter on 2026-01-01 to 2026-12-31

describe('the farm\u2019s performance tables', () => {
  const tables = performanceTables(base);

  it('when a group holds kits of two does, then its carcass is shared by their heads, and a kit processed alone goes to its birth litter', () => {
    const a = tables.does.find((d) => d.animal.id === 'A')!;
    const b = tables.does.find((d) => d.animal.id === 'B')!;
    expect(a.carcassGramsPerYear).toBeCloseTo((11000 * 6 / 10 + 1650) / years, 9); // 6,600 + 1,650 g
    expect(b.carcassGramsPerYear).toBeCloseTo((11000 * 4 / 10) / (363 / 365.25), 9); // 4,400 g; B is in production from 2026-01-03: 363 days
    expect(a.litterGainGramsPerDay).toBeCloseTo(40, 12); // (1,820 − 700 g a head) ÷ 28 days
    expect(b.groups).toBe(1);
  });

  it('when a group mixes crosses, then it shows as mixed and counts for no breed; the kit processed alone gives its cross a dress-out', () => {
    const g = tables.groups[0]!;
    expect(g).toMatchObject({ crossKey: 'mixed', crossLabel: 'Mixed litters', heads: 10, gainGrams: 13000, feedConversion: 4 }); // 52,000 ÷ (20,000 − 7,000)
    expect(g.dressOutPercent).toBeCloseTo(55, 10); // 11,000 ÷ 20,000
    const cross = tables.breeds.find((r) => r.key === 'cross:californian|new zealand')!;
    expect(cross).toMatchObject({ label: 'Californian × New Zealand', litters: 1, groups: 0, processingRecords: 1 });
    expect(cross.metrics.dressOutPercent.mean).toBeCloseTo(55, 10); // 1,650 ÷ 3,000
    expect(cross.metrics.adgGramsPerDay.n).toBe(0);
    const pure = tables.breeds.find((r) => r.key === 'pure:new zealand')!;
    expect(pure).toMatchObject({ litters: 1, groups: 0, processingRecords: 0 });
  });

  it('when grow-out, feed and processing records are not available, then their figures are left out and named', () => {
    const without = performanceTables({ ...base, groups: null, doeLitterFeed: null, processing: null });
    expect(without.missing).toEqual(['groups', 'doeLitterFeed', 'processing']);
    expect(without.groups).toEqual([]);
    const a = without.does.find((d) => d.animal.id === 'A')!;
    expect(a).toMatchObject({ carcassGramsPerYear: null, litterGainGramsPerDay: null, feedConversionToWeaning: null, feedConversionToMarket: null, averageBornAlive: 6 });
  });

  it('when the period is every record, then it runs from the first record to today', () => {
    expect(performanceTables({ ...base, period: null }).period).toEqual({ from: '2026-01-01', to: '2026-12-31' });
  });
});
