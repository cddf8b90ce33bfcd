import { describe, expect, it } from 'vitest';
import { relationshipInWords } from './relationship';

/**
 * A made-up family over four generations. The kinship terms checked are the usual genealogical ones (common
 * practice): siblings share parents, first cousins grandparents, second cousins great-grandparents.
 *
 *   GS × GD ─┬─ S1 (buck) × X1 ─┬─ A (buck) × Y1 ─ C (buck)
 *            │                   └─ B (doe)  × Y2 ─ D (doe)
 *            └─ S2 (doe)  × X2 ─── E (buck)
 *   S1 × Z ─ H (buck, half-brother of A and B)
 */
const parents: Record<string, { sireId: string | null; damId: string | null }> = {
  S1: { sireId: 'GS', damId: 'GD' },
  S2: { sireId: 'GS', damId: 'GD' },
  A: { sireId: 'S1', damId: 'X1' },
  B: { sireId: 'S1', damId: 'X1' },
  H: { sireId: 'S1', damId: 'Z' },
  E: { sireId: 'X2', damId: 'S2' },
  C: { sireId: 'A', damId: 'Y1' },
  D: { sireId: 'Y2', damId: 'B' },
};
const parentsOf = (id: string) => parents[id];
const words = (doe: string, buck: string) => relationshipInWords(parentsOf, doe, buck);

describe('relationship in words', () => {
  it('when the buck is her father or grandfather, then he is her sire or grandsire', () => {
    expect(words('B', 'S1')).toBe('her sire');
    expect(words('B', 'GS')).toBe('her grandsire');
    expect(words('D', 'S1')).toBe('her grandsire');
  });

  it('when the buck descends from her, then he is her son or grandson', () => {
    expect(words('S2', 'E')).toBe('her son');
    expect(words('B', 'C')).toBe('nephew (a son of her sibling)');
    expect(words('X1', 'C')).toBe('her grandson');
  });

  it('when they share both parents or one, then full or half siblings', () => {
    expect(words('B', 'A')).toBe('brother');
    expect(words('B', 'H')).toBe('half-brother');
  });

  it('when they share grandparents, then first cousins; one generation apart, once removed', () => {
    expect(words('D', 'C')).toBe('first cousin');
    expect(words('B', 'E')).toBe('first cousin');
    expect(words('D', 'E')).toBe('first cousin once removed');
    expect(words('S2', 'A')).toBe('nephew (a son of her sibling)');
  });

  it('when nothing is shared within four generations, then it says so', () => {
    expect(words('Y1', 'E')).toBe('no shared ancestor on record');
    expect(words('B', 'unknown-buck')).toBe('no shared ancestor on record');
  });
});
