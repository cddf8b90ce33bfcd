/**
 * The tabular method (Emik & Terrill 1949; Henderson 1976): the full additive relationship matrix A,
 * row by row in an order with parents first, a_ii = 1 + ½ a_sire,dam and a_ij = ½ (a_j,sire + a_j,dam)
 * (a term with an unknown parent is 0). F_i = a_ii − 1 and the kinship of i and j is a_ij / 2.
 *
 * Kept only as an independent check of the fast algorithm: O(n²) memory and time, small pedigrees
 * only. It shares no code with `inbreeding.ts` (its own ordering, its own founder handling).
 */
import type { PedigreeAnimal } from './pedigree-index';

export interface RelationshipMatrix {
  ids: string[];
  /** a[i][j], indexed like `ids`. */
  a: number[][];
  indexOf: Map<string, number>;
}

const MAX_ANIMALS = 3000;

export function additiveRelationshipMatrix(animals: ReadonlyArray<PedigreeAnimal>): RelationshipMatrix {
  const parents = new Map<string, [string | null, string | null]>();
  for (const animal of animals) {
    if (parents.has(animal.id)) throw new Error(`"${animal.id}" listed twice`);
    parents.set(animal.id, [animal.sireId ?? null, animal.damId ?? null]);
  }
  for (const animal of animals) {
    for (const parent of [animal.sireId, animal.damId]) {
      if (parent != null && !parents.has(parent)) parents.set(parent, [null, null]);
    }
  }
  if (parents.size > MAX_ANIMALS) throw new Error('The tabular method is for small pedigrees only');

  // Recursive depth-first ordering: fine for the small pedigrees this is meant for.
  const ids: string[] = [];
  const state = new Map<string, 'visiting' | 'done'>();
  const visit = (id: string): void => {
    const seen = state.get(id);
    if (seen === 'done') return;
    if (seen === 'visiting') throw new Error(`cycle at "${id}"`);
    state.set(id, 'visiting');
    for (const parent of parents.get(id)!) if (parent != null) visit(parent);
    state.set(id, 'done');
    ids.push(id);
  };
  for (const id of parents.keys()) visit(id);

  const indexOf = new Map(ids.map((id, i) => [id, i]));
  const n = ids.length;
  const a: number[][] = ids.map(() => new Array<number>(n).fill(0));
  const at = (i: number, j: number | undefined): number => (j === undefined ? 0 : a[i]![j]!);
  for (let i = 0; i < n; i++) {
    const [sireId, damId] = parents.get(ids[i]!)!;
    const s = sireId == null ? undefined : indexOf.get(sireId);
    const d = damId == null ? undefined : indexOf.get(damId);
    for (let j = 0; j < i; j++) {
      const value = 0.5 * (at(j, s) + at(j, d));
      a[i]![j] = value;
      a[j]![i] = value;
    }
    a[i]![i] = 1 + (s !== undefined && d !== undefined ? 0.5 * a[s]![d]! : 0);
  }
  return { ids, a, indexOf };
}

/** F of every listed animal by the tabular method. */
export function tabularInbreeding(animals: ReadonlyArray<PedigreeAnimal>): Map<string, number> {
  const { a, indexOf } = additiveRelationshipMatrix(animals);
  return new Map(animals.map((animal) => {
    const i = indexOf.get(animal.id)!;
    return [animal.id, a[i]![i]! - 1];
  }));
}

/** Kinship a_xy / 2 by the tabular method; an id not in the pedigree is an unrelated founder. */
export function tabularKinship(matrix: RelationshipMatrix, x: string, y: string): number {
  const i = matrix.indexOf.get(x);
  const j = matrix.indexOf.get(y);
  if (i === undefined || j === undefined) return x === y ? 0.5 : 0;
  return matrix.a[i]![j]! / 2;
}
