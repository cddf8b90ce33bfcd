/**
 * Pedigree completeness: for generation g (1 = parents, 2 = grandparents, …) the fraction of the 2^g
 * ancestor places that hold a known animal (the usual per-generation measure of pedigree analysis;
 * common practice). An ancestor reached by two paths fills two places. A parent named but not
 * listed is known (its own parents are not); an animal the pedigree does not know has none known.
 */
import { indexPedigree, type PedigreeAnimal } from './pedigree-index';

function checkGenerations(generations: number): void {
  if (!Number.isInteger(generations) || generations < 0 || generations > 60) {
    throw new RangeError('generations must be a whole number from 0 to 60');
  }
}

/** Fraction of known ancestors per generation, `[parents, grandparents, …]`, `generations` long. */
export function pedigreeCompleteness(animals: ReadonlyArray<PedigreeAnimal>, id: string, generations = 4): number[] {
  checkGenerations(generations);
  const index = indexPedigree(animals);
  const result = new Array<number>(generations).fill(0);
  // Distinct ancestors of the current generation with the number of places each fills.
  let places = new Map<number, number>();
  const start = index.positionOf(id);
  if (start >= 0) places.set(start, 1);
  for (let g = 0; g < generations && places.size > 0; g++) {
    const next = new Map<number, number>();
    let known = 0;
    for (const [position, count] of places) {
      for (const parent of [index.sire[position]!, index.dam[position]!]) {
        if (parent < 0) continue;
        known += count;
        next.set(parent, (next.get(parent) ?? 0) + count);
      }
    }
    result[g] = known / 2 ** (g + 1);
    places = next;
  }
  return result;
}

/** `pedigreeCompleteness` of every listed animal at once, in time linear in animals × generations. */
export function pedigreeCompletenessAll(animals: ReadonlyArray<PedigreeAnimal>, generations = 4): Map<string, number[]> {
  checkGenerations(generations);
  const index = indexPedigree(animals);
  const { size, sire, dam } = index;
  // known[p·G + g] = known ancestor places of p in generation g + 1; parents come first in position order.
  const known = new Float64Array(size * generations);
  for (let p = 0; p < size; p++) {
    const s = sire[p]!;
    const d = dam[p]!;
    if (generations === 0) break;
    known[p * generations] = (s >= 0 ? 1 : 0) + (d >= 0 ? 1 : 0);
    for (let g = 1; g < generations; g++) {
      known[p * generations + g] = (s >= 0 ? known[s * generations + g - 1]! : 0) + (d >= 0 ? known[d * generations + g - 1]! : 0);
    }
  }
  const result = new Map<string, number[]>();
  for (let row = 0; row < animals.length; row++) {
    const p = index.positionOfRow[row]!;
    const fractions = new Array<number>(generations);
    for (let g = 0; g < generations; g++) fractions[g] = known[p * generations + g]! / 2 ** (g + 1);
    result.set(animals[row]!.id, fractions);
  }
  return result;
}
