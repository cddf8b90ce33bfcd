import { describe, expect, it } from 'vitest';
import { breedingRecordFigures, type RecordLitter } from './breeding-record';

const litter = (l: Partial<RecordLitter> & Pick<RecordLitter, 'kindledOn'>): RecordLitter => ({
  bornAlive: 0, bornDead: 0, fosteredIn: 0, fosteredOut: 0, lost: 0, culled: 0, weaned: 0, weaningWeightGrams: null, weighedKits: 0, deaths: {}, ...l,
});

describe('a doe\'s breeding record in figures', () => {
  it('when she had four services, two litters and one empty, then the figures are worked out as by hand', () => {
    const figures = breedingRecordFigures(
      [
        { servicedOn: '2026-01-02', status: 'kindled' },
        { servicedOn: '2026-03-20', status: 'empty' },
        { servicedOn: '2026-04-01', status: 'kindled' },
        { servicedOn: '2026-06-10', status: 'open' },
      ],
      [
        // 8 born alive, 2 lost (chilled), 6 weaned weighing 5,400 g: 900 g a kit.
        litter({ kindledOn: '2026-02-02', bornAlive: 8, bornDead: 1, lost: 2, weaned: 6, weaningWeightGrams: 5400, weighedKits: 6, deaths: { chilled: 2 } }),
        // 6 born alive, 1 fostered in, 1 trampled, 6 still on her.
        litter({ kindledOn: '2026-05-02', bornAlive: 6, fosteredIn: 1, lost: 1, deaths: { trampled: 1 } }),
      ],
    );
    expect(figures).toMatchObject({
      services: 4, conceptions: 2,
      conceptionRate: 2 / 3, // kindled 2 of the 3 services with an outcome (the open one is not known yet)
      litters: 2, bornAlive: 14, bornDead: 1, fosteredIn: 1, lost: 3, weaned: 6,
      bornAlivePerLitter: 7, // (8 + 6) / 2
      weanedPerLitter: 6, // the finished litter only
      survivalToWeaning: 0.75, // 6 weaned of 8 raised
      weaningGramsPerKit: 900,
      kindlingIntervalDays: 89, // 2026-02-02 → 2026-05-02: 28 + 31 + 30 days
    });
    expect(figures.deaths).toEqual({ chilled: 2, trampled: 1, not_nursed: 0, born_weak: 0, illness: 0, predator: 0, unknown: 0, other: 0 });
  });

  it('when she has no record yet, then the averages are unknown rather than zero', () => {
    expect(breedingRecordFigures([], [])).toMatchObject({ conceptionRate: null, bornAlivePerLitter: null, kindlingIntervalDays: null, weaningGramsPerKit: null });
  });
});
