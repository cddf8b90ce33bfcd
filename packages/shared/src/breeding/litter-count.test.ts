import { describe, expect, it } from 'vitest';
import { checkFosterPairs, kitCount, LitterCountError, litterSummary, validateLitter, type LitterRecord } from './litter-count';

const litter = (events: LitterRecord['events'], more: Partial<LitterRecord> = {}): LitterRecord => ({
  id: 'L1', kindledOn: '2026-04-02', bornAlive: 8, bornDead: 0, events, ...more,
});

describe('litter counts from events', () => {
  it('when nothing has happened since the kindling, then the count is the born alive', () => {
    expect(kitCount(litter([]))).toBe(8);
    expect(kitCount(litter([]), '2026-04-01')).toBe(0); // before the kindling
  });

  it('when kits are fostered in and weaned on the same day, then the fostered kits count before the weaning', () => {
    const l = litter([
      { kind: 'weaned', on: '2026-05-14', count: 10 },
      { kind: 'fostered_in', on: '2026-05-14', count: 2, otherLitterId: 'L2' },
    ]);
    expect(validateLitter(l)).toEqual([]);
    expect(kitCount(l)).toBe(0);
  });

  it('when weaning is done in two steps, then survival waits for the last kit', () => {
    const partly = litter([{ kind: 'weaned', on: '2026-05-14', count: 5 }]);
    expect(litterSummary(partly)).toMatchObject({ weaned: 5, onDoe: 3, survivalToWeaning: null, weanedOn: '2026-05-14' });
    const all = litter([...partly.events, { kind: 'weaned', on: '2026-05-21', count: 3 }]);
    expect(litterSummary(all)).toMatchObject({ weaned: 8, onDoe: 0, survivalToWeaning: 1, weanedOn: '2026-05-21' });
  });

  it('when every kit is lost, then survival is 0 and the causes are tallied', () => {
    const l = litter([
      { kind: 'lost', on: '2026-04-03', count: 5, cause: 'Chilled' },
      { kind: 'lost', on: '2026-04-04', count: 3, cause: 'chilled ' },
    ]);
    expect(litterSummary(l)).toMatchObject({ lost: 8, survivalToWeaning: 0, lossesByCause: { chilled: 8 } });
  });

  it('when a litter of none was born alive, then survival is not a number to show', () => {
    expect(litterSummary(litter([], { bornAlive: 0, bornDead: 4 }))).toMatchObject({ totalBorn: 4, raised: 0, survivalToWeaning: null });
  });
});

describe('impossible litter records', () => {
  it('when counts are negative or not whole, then each is refused', () => {
    const issues = validateLitter(litter([{ kind: 'culled', on: '2026-04-05', count: 0 }], { bornAlive: -1, bornDead: 1.5 }));
    expect(issues.map((i) => [i.code, i.field])).toEqual([['bad_count', 'bornAlive'], ['bad_count', 'bornDead'], ['bad_count', 'count']]);
  });

  it('when an event is dated before the kindling or in the future, then it is refused', () => {
    const issues = validateLitter(litter([
      { id: 'e1', kind: 'lost', on: '2026-04-01', count: 1, cause: 'crushed' },
      { id: 'e2', kind: 'weaned', on: '2026-06-01', count: 1 },
    ]), '2026-05-01');
    expect(issues.map((i) => [i.code, i.eventId])).toEqual([['before_kindling', 'e1'], ['in_future', 'e2']]);
    expect(issues[0]!.message).toBe('Lost on 2026-04-01, before the kindling on 2026-04-02');
  });

  it('when the kindling itself is in the future or not a date, then it is refused', () => {
    expect(validateLitter(litter([]), '2026-04-01')[0]).toMatchObject({ code: 'in_future', field: 'kindledOn' });
    expect(validateLitter(litter([], { kindledOn: '2026-02-30' }))[0]).toMatchObject({ code: 'bad_date' });
  });

  it('when a fostering names no litter or this one, or a loss gives no cause, then each is refused', () => {
    const issues = validateLitter(litter([
      { kind: 'fostered_out', on: '2026-04-03', count: 1, otherLitterId: '' },
      { kind: 'fostered_in', on: '2026-04-03', count: 1, otherLitterId: 'L1' },
      { kind: 'lost', on: '2026-04-04', count: 1, cause: '  ' },
    ]));
    expect(issues.map((i) => i.code)).toEqual(['no_other_litter', 'fostered_with_itself', 'no_cause']);
  });

  it('when more kits are fostered out than the doe has, then it is refused at that event', () => {
    const issues = validateLitter(litter([
      { kind: 'lost', on: '2026-04-03', count: 2, cause: 'crushed' },
      { kind: 'fostered_out', on: '2026-04-04', count: 7, otherLitterId: 'L2' },
    ]));
    expect(issues).toMatchObject([{ code: 'more_than_on_doe', eventIndex: 1 }]);
    expect(issues[0]!.message).toContain('Fostered out 7 kits on 2026-04-04, but only 6 kits were with the doe');
  });

  it('when a count is asked of an impossible record, then it throws with the issues', () => {
    const bad = litter([{ kind: 'weaned', on: '2026-05-14', count: 9 }]);
    expect(() => kitCount(bad)).toThrow(LitterCountError);
    expect(() => litterSummary(bad)).toThrow(LitterCountError);
    expect(() => litterSummary(bad)).toThrow(expect.objectContaining({ issues: [expect.objectContaining({ code: 'more_than_on_doe' })] }));
  });

  it('when the two sides of a fostering disagree, then both litters get an issue', () => {
    const a = { ...litter([{ kind: 'fostered_out', on: '2026-04-03', count: 2, otherLitterId: 'L2' }]), id: 'L1' };
    const b = { ...litter([{ kind: 'fostered_in', on: '2026-04-03', count: 3, otherLitterId: 'L1' }]), id: 'L2' };
    const issues = checkFosterPairs([a, b]);
    expect(issues.map((i) => i.message)).toEqual([
      '2 kits fostered out on 2026-04-03, but the other litter records 3 kits fostered in from this one that day',
      '3 kits fostered in on 2026-04-03, but the other litter records 2 kits fostered out to this one that day',
    ]);
  });

  it('when the other litter is on a farm we cannot see, then the pair is not checked', () => {
    const a = { ...litter([{ kind: 'fostered_out', on: '2026-04-03', count: 2, otherLitterId: 'elsewhere' }]), id: 'L1' };
    expect(checkFosterPairs([a])).toEqual([]);
  });
});
