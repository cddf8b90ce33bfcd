/**
 * A co-op's whole pedigree kept in memory: ids → sire, dam and F (coefficient of inbreeding) on typed
 * arrays, built once and then updated in place as animals are added or their parents corrected, so
 * comparing a doe with many bucks never re-reads or re-indexes the pedigree.
 *
 * - Positions stay topological (parents first). A new animal is appended after its parents; a corrected
 *   parent that is already older than the animal changes it in place. Anything else (a parent recorded
 *   after its offspring, an animal removed) rebuilds the index, which is rare and still linear.
 * - After a change, only the changed animals and their descendants are traced again (one ascending
 *   pass finds the descendants); everyone else's F stays. The result equals a full recompute.
 * - An id named as a parent but not listed is a founder (as everywhere in pedigree code); an id the
 *   pedigree does not know is an unrelated founder in the queries.
 */
import { indexPedigree, PedigreeCycleError, type PedigreeAnimal } from './pedigree-index';
import { TraceKernel } from './trace-kernel';

const NONE = -1;

export class CoopPedigree {
  private kernel: TraceKernel;
  private ids: string[] = [];
  private positionOf = new Map<string, number>();
  /** 1 where the animal is listed (0: a founder only named as a parent). */
  private listed = new Uint8Array(16);

  private constructor(capacity: number) {
    this.kernel = new TraceKernel(capacity);
  }

  /** Indexes the rows (any order) and computes every F. Throws like `indexPedigree` on duplicates and cycles. */
  static build(animals: ReadonlyArray<PedigreeAnimal>): CoopPedigree {
    const index = indexPedigree(animals);
    const pedigree = new CoopPedigree(index.size);
    pedigree.listed = new Uint8Array(pedigree.kernel.capacity);
    for (let position = 0; position < index.size; position++) {
      pedigree.kernel.place(position, index.sire[position]!, index.dam[position]!);
      pedigree.ids.push(index.ids[position]!);
      pedigree.positionOf.set(index.ids[position]!, position);
      if (index.rowOf[position]! >= 0) pedigree.listed[position] = 1;
    }
    pedigree.kernel.settleRange(0, index.size);
    return pedigree;
  }

  /** Listed animals and founders named as parents. */
  get size(): number {
    return this.ids.length;
  }

  has(id: string): boolean {
    return this.positionOf.has(id);
  }

  /** F of an animal, or `undefined` when the pedigree does not know it. */
  inbreeding(id: string): number | undefined {
    const position = this.positionOf.get(id);
    return position === undefined ? undefined : this.kernel.f[position]!;
  }

  parentsOf(id: string): { sireId: string | null; damId: string | null } | undefined {
    const position = this.positionOf.get(id);
    if (position === undefined) return undefined;
    const s = this.kernel.sire[position]!;
    const d = this.kernel.dam[position]!;
    return { sireId: s < 0 ? null : this.ids[s]!, damId: d < 0 ? null : this.ids[d]! };
  }

  /** Every listed animal with its parents (e.g. to compare with a full recompute). */
  rows(): PedigreeAnimal[] {
    const out: PedigreeAnimal[] = [];
    for (let position = 0; position < this.ids.length; position++) {
      if (this.listed[position]) out.push({ id: this.ids[position]!, ...this.parentsOf(this.ids[position]!)! });
    }
    return out;
  }

  /** F of every listed animal. */
  inbreedingAll(): Map<string, number> {
    const out = new Map<string, number>();
    for (let position = 0; position < this.ids.length; position++) {
      if (this.listed[position]) out.set(this.ids[position]!, this.kernel.f[position]!);
    }
    return out;
  }

  /** Kinship (coefficient of coancestry) of two animals: ½ a_xy, (1 + F) / 2 for an animal with itself. */
  kinship(a: string, b: string): number {
    return this.offspringInbreedingMany(b, [a]).get(a)!;
  }

  /**
   * F of the litter of one doe with each candidate buck (the kinship of the two): the doe's row of L is
   * traced once, then each buck's row, over their own ancestors only.
   */
  offspringInbreedingMany(damId: string, sireIds: ReadonlyArray<string>): Map<string, number> {
    const result = new Map<string, number>();
    const dm = this.positionOf.get(damId);
    if (dm !== undefined) this.kernel.keepRow(dm);
    try {
      for (const sireId of sireIds) {
        const s = this.positionOf.get(sireId);
        if (s === undefined || dm === undefined) result.set(sireId, sireId === damId ? 0.5 : 0);
        else result.set(sireId, this.kernel.kinshipWithKept(s));
      }
    } finally {
      this.kernel.clearKept();
    }
    return result;
  }

  /**
   * Brings the pedigree up to date with the current rows of some animals (new ones, or ones whose sire
   * or dam changed) and removes `removedIds` (e.g. merged duplicates). Recomputes F of the changed
   * animals and their descendants only. Returns how many positions were recomputed. Throws
   * `PedigreeCycleError` when the change would make an animal its own ancestor (nothing is changed then).
   */
  apply(changed: ReadonlyArray<PedigreeAnimal>, removedIds: ReadonlyArray<string> = []): number {
    if (removedIds.some((id) => this.positionOf.has(id))) return this.rebuild(changed, removedIds);
    const fresh: PedigreeAnimal[] = [];
    const moved: { position: number; s: number; d: number }[] = [];
    const freshIds = new Set<string>();
    for (const row of changed) {
      const position = this.positionOf.get(row.id);
      if (position === undefined || !this.listed[position]) {
        if (position !== undefined) return this.rebuild(changed, removedIds); // a founder gets its own row
        fresh.push(row);
        freshIds.add(row.id);
        continue;
      }
      const s = this.parentPosition(row.sireId, freshIds);
      const d = this.parentPosition(row.damId, freshIds);
      if (s === undefined || d === undefined || s >= position || d >= position) return this.rebuild(changed, removedIds);
      if (s !== this.kernel.sire[position] || d !== this.kernel.dam[position]) moved.push({ position, s, d });
    }
    // New animals in an order with parents first (within the batch), each appended after its parents.
    const ordered = orderWithinBatch(fresh);
    const firstNew = this.ids.length;
    this.kernel.ensureCapacity(firstNew + 2 * ordered.length);
    this.growListed(this.kernel.capacity);
    const founders: string[] = [];
    for (const row of ordered) {
      for (const parent of [row.sireId, row.damId]) {
        if (parent != null && !this.positionOf.has(parent) && !freshIds.has(parent) && !founders.includes(parent)) founders.push(parent);
      }
    }
    for (const id of founders) this.append(id, NONE, NONE, 0);
    for (const row of ordered) {
      this.append(row.id, this.positionOrNone(row.sireId), this.positionOrNone(row.damId), 1);
    }
    if (moved.length === 0 && ordered.length === 0) return 0;

    const affected = new Uint8Array(this.ids.length);
    let from = firstNew;
    for (const { position, s, d } of moved) {
      this.kernel.place(position, s, d);
      affected[position] = 1;
      if (position < from) from = position;
    }
    for (let position = firstNew; position < this.ids.length; position++) affected[position] = 1;
    this.kernel.markDescendants(affected, from, this.ids.length);
    // Generations below a moved animal may change too: place again in order before tracing.
    for (let position = from; position < this.ids.length; position++) {
      if (affected[position]) this.kernel.place(position, this.kernel.sire[position]!, this.kernel.dam[position]!);
    }
    this.kernel.settleRange(from, this.ids.length, affected);
    let count = 0;
    for (let position = from; position < this.ids.length; position++) count += affected[position]!;
    return count;
  }

  private parentPosition(id: string | null, freshIds: ReadonlySet<string>): number | undefined {
    if (id == null) return NONE;
    if (freshIds.has(id)) return undefined; // an existing animal's parent among the new ones: rebuild
    return this.positionOf.get(id);
  }

  private positionOrNone(id: string | null): number {
    return id == null ? NONE : this.positionOf.get(id)!;
  }

  private append(id: string, s: number, d: number, listed: 0 | 1): void {
    const position = this.ids.length;
    this.ids.push(id);
    this.positionOf.set(id, position);
    this.kernel.place(position, s, d);
    this.listed[position] = listed;
  }

  private growListed(capacity: number): void {
    if (this.listed.length >= capacity) return;
    const listed = new Uint8Array(capacity);
    listed.set(this.listed);
    this.listed = listed;
  }

  /** Re-indexes everything with the change applied (validating it first) and recomputes every F. */
  private rebuild(changed: ReadonlyArray<PedigreeAnimal>, removedIds: ReadonlyArray<string>): number {
    const byId = new Map(this.rows().map((row) => [row.id, row]));
    for (const id of removedIds) byId.delete(id);
    for (const row of changed) byId.set(row.id, { id: row.id, sireId: row.sireId ?? null, damId: row.damId ?? null });
    const next = CoopPedigree.build([...byId.values()]);
    this.kernel = next.kernel;
    this.ids = next.ids;
    this.positionOf = next.positionOf;
    this.listed = next.listed;
    return this.ids.length;
  }
}

/** The rows with every parent in the batch before its offspring; throws on a cycle within the batch. */
function orderWithinBatch(rows: ReadonlyArray<PedigreeAnimal>): PedigreeAnimal[] {
  if (rows.length <= 1) return [...rows];
  const byId = new Map(rows.map((row) => [row.id, row]));
  const state = new Map<string, 1 | 2>();
  const out: PedigreeAnimal[] = [];
  for (const root of rows) {
    if (state.has(root.id)) continue;
    const stack: string[] = [root.id];
    state.set(root.id, 1);
    while (stack.length > 0) {
      const id = stack[stack.length - 1]!;
      const row = byId.get(id)!;
      const pending = [row.sireId, row.damId].find((p) => p != null && byId.has(p) && state.get(p) !== 2);
      if (pending != null) {
        if (state.get(pending) === 1) throw new PedigreeCycleError([...stack.slice(stack.indexOf(pending)), pending]);
        state.set(pending, 1);
        stack.push(pending);
        continue;
      }
      stack.pop();
      state.set(id, 2);
      out.push(row);
    }
  }
  return out;
}
