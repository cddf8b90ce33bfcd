/**
 * A tiny seeded pseudo-random generator (mulberry32, a public-domain 32-bit generator) so random
 * pedigrees in tests and benchmarks reproduce from their seed. Not for anything secret.
 */
export type Random = () => number;

export function seededRandom(seed: number): Random {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A whole number from `min` to `max` inclusive. */
export function randomInt(random: Random, min: number, max: number): number {
  return min + Math.floor(random() * (max - min + 1));
}

export function pick<T>(random: Random, items: ReadonlyArray<T>): T {
  if (items.length === 0) throw new Error('pick from an empty list');
  return items[Math.floor(random() * items.length)]!;
}

/** A shuffled copy (Fisher–Yates). */
export function shuffled<T>(random: Random, items: ReadonlyArray<T>): T[] {
  const copy = [...items];
  for (let i = copy.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [copy[i], copy[j]] = [copy[j]!, copy[i]!];
  }
  return copy;
}
