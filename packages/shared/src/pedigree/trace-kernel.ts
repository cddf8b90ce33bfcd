/**
 * The Meuwissen & Luo (1992) trace on typed arrays, shared by the one-off computations
 * (`inbreeding.ts`) and the co-op's kept pedigree (`coop-pedigree.ts`).
 *
 * A row of L is traced from an animal back through its ancestors, and an ancestor may be taken only
 * once every descendant of it in that row has passed on its share. The paper takes the youngest queued
 * ancestor each time (a priority queue, e.g. a heap, costing log k per step). Here each animal carries
 * its generation (one more than its older parent; founders 0): parents are always of a lower
 * generation, so taking the queued ancestors generation by generation, highest first, is a valid order,
 * and a queue per generation (a linked list through `next`) makes each step constant time. This is
 * the ordering of Sargolzaei, Iwaisaki & Colleau (2005), "A fast algorithm for computing inbreeding
 * coefficients in large populations", J. Anim. Breed. Genet. 122:325–331.
 *
 * Positions must be topological (every parent before its offspring); the kernel grows as animals are
 * added and never reads a position it was not told about.
 */
const NONE = -1;

export class TraceKernel {
  sire: Int32Array;
  dam: Int32Array;
  generation: Int32Array;
  /** F by position; valid where `known` is 1. */
  f: Float64Array;
  /** Mendelian-sampling variance d_i = ½ − ¼(F_sire + F_dam) (F = −1 for an unknown parent). */
  d: Float64Array;
  known: Uint8Array;
  /** One row of L, all zero between traces (non-zero = queued). */
  private l: Float64Array;
  private next: Int32Array;
  private head: Int32Array;
  /** A second row kept while other rows are traced (kinship of one animal with many). */
  private kept: Float64Array;
  private keptPositions: Int32Array;
  private keptCount = 0;

  constructor(capacity: number) {
    const size = Math.max(16, capacity);
    this.sire = new Int32Array(size).fill(NONE);
    this.dam = new Int32Array(size).fill(NONE);
    this.generation = new Int32Array(size);
    this.f = new Float64Array(size);
    this.d = new Float64Array(size);
    this.known = new Uint8Array(size);
    this.l = new Float64Array(size);
    this.next = new Int32Array(size);
    this.head = new Int32Array(64).fill(NONE);
    this.kept = new Float64Array(size);
    this.keptPositions = new Int32Array(size);
  }

  get capacity(): number {
    return this.sire.length;
  }

  /** Makes room for positions below `capacity` (doubling, so appends stay cheap). */
  ensureCapacity(capacity: number): void {
    if (capacity <= this.sire.length) return;
    let size = this.sire.length;
    while (size < capacity) size *= 2;
    const grow = <T extends Int32Array | Float64Array | Uint8Array>(old: T, fill?: number): T => {
      const copy = new (old.constructor as new (n: number) => T)(size);
      if (fill !== undefined) copy.fill(fill);
      copy.set(old);
      return copy;
    };
    this.sire = grow(this.sire, NONE);
    this.dam = grow(this.dam, NONE);
    this.generation = grow(this.generation);
    this.f = grow(this.f);
    this.d = grow(this.d);
    this.known = grow(this.known);
    this.l = new Float64Array(size);
    this.next = new Int32Array(size);
    this.kept = new Float64Array(size);
    this.keptPositions = new Int32Array(size);
  }

  /** Records the parents of `position` (both already placed) and its generation; F is not known yet. */
  place(position: number, s: number, dm: number): void {
    this.sire[position] = s;
    this.dam[position] = dm;
    const generation = Math.max(s < 0 ? -1 : this.generation[s]!, dm < 0 ? -1 : this.generation[dm]!) + 1;
    this.generation[position] = generation;
    if (generation >= this.head.length) {
      const head = new Int32Array(Math.max(generation + 1, this.head.length * 2)).fill(NONE);
      this.head = head;
    }
    this.known[position] = 0;
  }

  /** Sets F of `position` (computed or given) and its d from the parents' F (which must be known). */
  settle(position: number, f: number): void {
    const s = this.sire[position]!;
    const dm = this.dam[position]!;
    const fs = s < 0 ? -1 : this.f[s]!;
    const fd = dm < 0 ? -1 : this.f[dm]!;
    this.f[position] = f;
    this.d[position] = 0.5 - 0.25 * (fs + fd);
    this.known[position] = 1;
  }

  /**
   * F of every position in [from, to), ascending; every position below `from` must be settled.
   * Full sibs (the same pair of parents) share one trace.
   */
  settleRange(from: number, to: number, only?: Uint8Array): number {
    const byParents = new Map<number, number>();
    const { sire, dam } = this;
    const span = this.capacity;
    let traced = 0;
    for (let position = from; position < to; position++) {
      if (only && !only[position]) continue;
      const s = sire[position]!;
      const dm = dam[position]!;
      let f = 0;
      if (s >= 0 && dm >= 0) {
        const key = s < dm ? s * span + dm : dm * span + s;
        const cached = byParents.get(key);
        if (cached === undefined) {
          f = this.offspringF(s, dm);
          byParents.set(key, f);
          traced++;
        } else {
          f = cached;
        }
      }
      this.settle(position, f);
    }
    return traced;
  }

  /**
   * F of a (real or virtual) offspring of `s` × `dm` — equal to the kinship of `s` and `dm`.
   * Needs F and d of every ancestor of `s` and `dm`, including themselves.
   */
  offspringF(s: number, dm: number): number {
    if (s < 0 || dm < 0) return 0;
    const { f, d, l, next, head, sire, dam, generation } = this;
    // The offspring's own term l_ii² d_i, with l_ii = 1.
    let diagonal = 0.5 - 0.25 * (f[s]! + f[dm]!);
    // Queue the parents with l = ½ each (l = 1 when the same animal is both sire and dam).
    let top = generation[s]!;
    next[s] = head[top]!;
    head[top] = s;
    // Queued ancestors not yet taken: stop at the last one rather than at generation 0.
    let pending = 1;
    if (dm === s) {
      l[s] = 1;
    } else {
      pending = 2;
      l[s] = 0.5;
      l[dm] = 0.5;
      const g = generation[dm]!;
      next[dm] = head[g]!;
      head[g] = dm;
      if (g > top) top = g;
    }
    // The same walk as traceRow, written out: a visit callback or a shared enqueue helper here cost 5–10 %
    // of the full recompute in the pedigree bench, the figure this kernel exists for.
    for (let g = top; pending > 0; g--) {
      let j = head[g]!;
      while (j !== NONE) {
        head[g] = next[j]!;
        pending--;
        const lj = l[j]!;
        l[j] = 0;
        diagonal += lj * lj * d[j]!;
        const half = 0.5 * lj;
        const sj = sire[j]!;
        if (sj >= 0) {
          if (l[sj] === 0) {
            const gs = generation[sj]!;
            next[sj] = head[gs]!;
            head[gs] = sj;
            pending++;
          }
          l[sj]! += half;
        }
        const dj = dam[j]!;
        if (dj >= 0) {
          if (l[dj] === 0) {
            const gd = generation[dj]!;
            next[dj] = head[gd]!;
            head[gd] = dj;
            pending++;
          }
          l[dj]! += half;
        }
        j = head[g]!;
      }
    }
    return diagonal - 1;
  }

  /**
   * Traces row `x` of L (x itself with l = 1) and calls `visit(j, l_xj)` for each ancestor j.
   * A kinship is then a dot product of two rows weighted by d: a_xy = Σ_j l_xj l_yj d_j.
   */
  private traceRow(x: number, visit: (j: number, lj: number) => void): void {
    const { l, next, head, sire, dam, generation } = this;
    const top = generation[x]!;
    l[x] = 1;
    next[x] = head[top]!;
    head[top] = x;
    let pending = 1;
    for (let g = top; pending > 0; g--) {
      let j = head[g]!;
      while (j !== NONE) {
        head[g] = next[j]!;
        pending--;
        const lj = l[j]!;
        l[j] = 0;
        visit(j, lj);
        const half = 0.5 * lj;
        const sj = sire[j]!;
        if (sj >= 0) {
          if (l[sj] === 0) {
            const gs = generation[sj]!;
            next[sj] = head[gs]!;
            head[gs] = sj;
            pending++;
          }
          l[sj]! += half;
        }
        const dj = dam[j]!;
        if (dj >= 0) {
          if (l[dj] === 0) {
            const gd = generation[dj]!;
            next[dj] = head[gd]!;
            head[gd] = dj;
            pending++;
          }
          l[dj]! += half;
        }
        j = head[g]!;
      }
    }
  }

  /** Keeps row `x` of L, weighted by d, for `kinshipWithKept` (replaces any row kept before). */
  keepRow(x: number): void {
    this.clearKept();
    const { kept, keptPositions, d } = this;
    let count = 0;
    this.traceRow(x, (j, lj) => {
      kept[j] = lj * d[j]!;
      keptPositions[count++] = j;
    });
    this.keptCount = count;
  }

  /** Kinship of `y` with the kept animal: ½ Σ_j l_yj (l_xj d_j), over y's ancestors only. */
  kinshipWithKept(y: number): number {
    const { kept } = this;
    let sum = 0;
    this.traceRow(y, (j, lj) => {
      sum += lj * kept[j]!;
    });
    return 0.5 * sum;
  }

  clearKept(): void {
    for (let i = 0; i < this.keptCount; i++) this.kept[this.keptPositions[i]!] = 0;
    this.keptCount = 0;
  }

  /**
   * Marks `affected` positions' descendants (positions from `from` on whose sire or dam is marked):
   * positions are topological, so one ascending pass finds them all.
   */
  markDescendants(affected: Uint8Array, from: number, to: number): void {
    const { sire, dam } = this;
    for (let position = from; position < to; position++) {
      if (affected[position]) continue;
      const s = sire[position]!;
      const dm = dam[position]!;
      if ((s >= 0 && affected[s]) || (dm >= 0 && affected[dm])) affected[position] = 1;
    }
  }

}
