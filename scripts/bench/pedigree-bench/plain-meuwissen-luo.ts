/**
 * The yardstick for the pedigree benchmark: Meuwissen & Luo (1992), Genet. Sel. Evol. 24:305–313,
 * written as the paper gives it, on typed arrays: animals numbered parents first; for each animal i a
 * list starting with i (L_ii = 1), repeatedly taking the youngest animal j of the list (here a binary
 * max-heap), adding L_ij² d_j to a_ii and passing ½ L_ij to each known parent of j; F_i = a_ii − 1 and
 * d_i = ½ − ¼(F_sire + F_dam) (F = −1 for an unknown parent). One trace per animal, no shortcuts.
 */
import type { PedigreeIndex } from '../../../packages/shared/src/pedigree/pedigree-index';

/** F by position of an indexed pedigree (positions parents first). */
export function plainMeuwissenLuo({ size, sire, dam }: Pick<PedigreeIndex, 'size' | 'sire' | 'dam'>): Float64Array {
  const f = new Float64Array(size);
  const d = new Float64Array(size);
  const l = new Float64Array(size);
  const heap = new Int32Array(size);
  const push = (count: number, value: number) => {
    let i = count;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (heap[parent]! >= value) break;
      heap[i] = heap[parent]!;
      i = parent;
    }
    heap[i] = value;
    return count + 1;
  };
  const pop = (count: number) => {
    const top = heap[0]!;
    const last = heap[--count]!;
    let i = 0;
    for (;;) {
      let child = 2 * i + 1;
      if (child >= count) break;
      if (child + 1 < count && heap[child + 1]! > heap[child]!) child++;
      if (heap[child]! <= last) break;
      heap[i] = heap[child]!;
      i = child;
    }
    if (count > 0) heap[i] = last;
    return top;
  };
  for (let i = 0; i < size; i++) {
    const s = sire[i]!;
    const dm = dam[i]!;
    d[i] = 0.5 - 0.25 * ((s < 0 ? -1 : f[s]!) + (dm < 0 ? -1 : f[dm]!));
    if (s < 0 || dm < 0) {
      f[i] = 0;
      continue;
    }
    let aii = 0;
    let count = push(0, i);
    l[i] = 1;
    while (count > 0) {
      const j = pop(count);
      count--;
      const lj = l[j]!;
      l[j] = 0;
      aii += lj * lj * d[j]!;
      const sj = sire[j]!;
      if (sj >= 0) {
        if (l[sj] === 0) count = push(count, sj);
        l[sj]! += 0.5 * lj;
      }
      const dj = dam[j]!;
      if (dj >= 0) {
        if (l[dj] === 0) count = push(count, dj);
        l[dj]! += 0.5 * lj;
      }
    }
    f[i] = aii - 1;
  }
  return f;
}
