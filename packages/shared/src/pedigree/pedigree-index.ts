/**
 * Turns a list of animals with sire/dam ids into integer arrays in topological order (every parent
 * before its offspring), the form every pedigree computation here works on.
 *
 * - Rows may come in any order (offspring before parents).
 * - An id named as a parent but not listed is one founder (unknown parents), shared by every row that
 *   names it.
 * - An id listed twice throws `PedigreeDuplicateError`; a cycle (an animal its own ancestor, including
 *   its own parent) throws `PedigreeCycleError` naming the animals in the cycle.
 * - The sort is an iterative depth-first search with explicit stacks, so deep pedigrees (100,000+
 *   animals) cannot overflow the call stack.
 */

export interface PedigreeAnimal {
  readonly id: string;
  /** `null` (or absent) = unknown sire. */
  readonly sireId: string | null;
  /** `null` (or absent) = unknown dam. */
  readonly damId: string | null;
}

/** An animal appears more than once in the list given to a pedigree computation. */
export class PedigreeDuplicateError extends Error {
  readonly animalId: string;
  constructor(animalId: string) {
    super(`Pedigree error: animal "${animalId}" is listed more than once`);
    this.name = 'PedigreeDuplicateError';
    this.animalId = animalId;
  }
}

/** Following parents from `animalId` leads back to `animalId`. */
export class PedigreeCycleError extends Error {
  /** An animal in the cycle (the one it was found at). */
  readonly animalId: string;
  /** The cycle, starting and ending at `animalId`; each next id is a parent of the one before. */
  readonly cycle: readonly string[];
  constructor(cycle: readonly string[]) {
    const animalId = cycle[0] ?? '';
    const description =
      cycle.length <= 2
        ? `animal "${animalId}" is its own parent`
        : `animal "${animalId}" is its own ancestor (${cycle.map((id) => `"${id}"`).join(' → ')}, each arrow pointing to a parent)`;
    super(`Pedigree cycle: ${description}`);
    this.name = 'PedigreeCycleError';
    this.animalId = animalId;
    this.cycle = cycle;
  }
}

export interface PedigreeIndex {
  /** Listed animals plus the unlisted founders named as parents. */
  readonly size: number;
  /** Id at each position; positions are a topological order (parents first). */
  readonly ids: readonly string[];
  /** Sire position at each position, -1 = unknown. */
  readonly sire: Int32Array;
  /** Dam position at each position, -1 = unknown. */
  readonly dam: Int32Array;
  /** Input row at each position, -1 for an unlisted founder. */
  readonly rowOf: Int32Array;
  /** Position of each input row (same order as the input list). */
  readonly positionOfRow: Int32Array;
  /** Position of an id (listed or named as a parent), or -1 if the pedigree does not know it. */
  positionOf(id: string): number;
}

const UNKNOWN = -1;

/** Builds the index, or throws on a duplicate row or a cycle. */
export function indexPedigree(animals: ReadonlyArray<PedigreeAnimal>): PedigreeIndex {
  const rows = animals.length;
  const slotOf = new Map<string, number>();
  const slotIds: string[] = new Array<string>(rows);
  for (let row = 0; row < rows; row++) {
    const id = animals[row]!.id;
    if (slotOf.has(id)) throw new PedigreeDuplicateError(id);
    slotOf.set(id, row);
    slotIds[row] = id;
  }
  const slotOfParent = (id: string | null | undefined): number => {
    if (id == null) return UNKNOWN;
    let slot = slotOf.get(id);
    if (slot === undefined) {
      slot = slotIds.length;
      slotOf.set(id, slot);
      slotIds.push(id);
    }
    return slot;
  };
  // Slots 0..rows-1 are the listed rows; slots from `rows` on are unlisted founders (no parents).
  const slotSire = new Int32Array(rows);
  const slotDam = new Int32Array(rows);
  for (let row = 0; row < rows; row++) {
    const animal = animals[row]!;
    slotSire[row] = slotOfParent(animal.sireId);
    slotDam[row] = slotOfParent(animal.damId);
  }
  const size = slotIds.length;

  // Iterative depth-first search towards the parents; the stack always holds the current path, so a
  // parent found on it (state 1) closes a cycle. An animal gets its position once both parents have one.
  const state = new Uint8Array(size); // 0 unseen, 1 on the path, 2 placed
  const positionOfSlot = new Int32Array(size);
  const stack = new Int32Array(size);
  let placed = 0;
  for (let root = 0; root < size; root++) {
    if (state[root] !== 0) continue;
    let top = 0;
    stack[top++] = root;
    state[root] = 1;
    while (top > 0) {
      const slot = stack[top - 1]!;
      if (slot < rows) {
        const s = slotSire[slot]!;
        if (s !== UNKNOWN && state[s] !== 2) {
          if (state[s] === 1) throw cycleError(stack, top, s, slotIds);
          state[s] = 1;
          stack[top++] = s;
          continue;
        }
        const d = slotDam[slot]!;
        if (d !== UNKNOWN && state[d] !== 2) {
          if (state[d] === 1) throw cycleError(stack, top, d, slotIds);
          state[d] = 1;
          stack[top++] = d;
          continue;
        }
      }
      top--;
      state[slot] = 2;
      positionOfSlot[slot] = placed++;
    }
  }

  const ids = new Array<string>(size);
  const sire = new Int32Array(size).fill(UNKNOWN);
  const dam = new Int32Array(size).fill(UNKNOWN);
  const rowOf = new Int32Array(size).fill(UNKNOWN);
  const positionOfRow = new Int32Array(rows);
  for (let slot = 0; slot < size; slot++) {
    const position = positionOfSlot[slot]!;
    ids[position] = slotIds[slot]!;
    if (slot < rows) {
      const s = slotSire[slot]!;
      const d = slotDam[slot]!;
      sire[position] = s === UNKNOWN ? UNKNOWN : positionOfSlot[s]!;
      dam[position] = d === UNKNOWN ? UNKNOWN : positionOfSlot[d]!;
      rowOf[position] = slot;
      positionOfRow[slot] = position;
    }
  }
  return {
    size,
    ids,
    sire,
    dam,
    rowOf,
    positionOfRow,
    positionOf(id: string): number {
      const slot = slotOf.get(id);
      return slot === undefined ? UNKNOWN : positionOfSlot[slot]!;
    },
  };
}

function cycleError(stack: Int32Array, top: number, closing: number, slotIds: readonly string[]): PedigreeCycleError {
  let start = top - 1;
  while (start > 0 && stack[start] !== closing) start--;
  const cycle: string[] = [];
  for (let i = start; i < top; i++) cycle.push(slotIds[stack[i]!]!);
  cycle.push(slotIds[closing]!);
  return new PedigreeCycleError(cycle);
}

/**
 * Finds a cycle without throwing: the ids of one cycle (first = last, each next id a parent of the one
 * before), or `null` when the pedigree has none. Handy to validate a proposed parent before saving.
 * Still throws `PedigreeDuplicateError` for an id listed twice.
 */
export function findPedigreeCycle(animals: ReadonlyArray<PedigreeAnimal>): string[] | null {
  try {
    indexPedigree(animals);
    return null;
  } catch (error) {
    if (error instanceof PedigreeCycleError) return [...error.cycle];
    throw error;
  }
}

/**
 * Positions of the given animals and all their ancestors, ascending (so parents come first).
 * Walks the ancestors only, never the whole pedigree.
 */
export function ancestorClosure(index: PedigreeIndex, start: ReadonlyArray<number>, mark: Uint8Array): Int32Array {
  const found: number[] = [];
  const stack: number[] = [];
  for (const position of start) {
    if (position >= 0 && mark[position] === 0) {
      mark[position] = 1;
      stack.push(position);
    }
  }
  while (stack.length > 0) {
    const position = stack.pop()!;
    found.push(position);
    const s = index.sire[position]!;
    if (s >= 0 && mark[s] === 0) {
      mark[s] = 1;
      stack.push(s);
    }
    const d = index.dam[position]!;
    if (d >= 0 && mark[d] === 0) {
      mark[d] = 1;
      stack.push(d);
    }
  }
  for (const position of found) mark[position] = 0;
  return Int32Array.from(found).sort();
}
