/**
 * Coefficients of inbreeding (F) and kinship (coefficient of coancestry) over a pedigree.
 *
 * Algorithm: Meuwissen, T.H.E. & Luo, Z. (1992) "Computing inbreeding coefficients in large
 * populations", Genet. Sel. Evol. 24:305–313. With A = L·D·L' (L lower triangular, D diagonal with
 * d_i = ½ − ¼(F_sire + F_dam), taking F = −1 for an unknown parent, so d = 1 for a founder and
 * ¾ − ¼F for one known parent), the diagonal is a_ii = Σ_j l_ij² d_j over i and its ancestors j, and
 * F_i = a_ii − 1. Row i of L is traced from i back through its ancestors, youngest first, so each
 * ancestor is visited once per row (see `trace-kernel.ts` for the order kept by generation).
 *
 * Two savings on top of the paper: the animals' F depends only on the pair of parents, so full sibs
 * (the litter mates of one mating, and repeat matings) share one trace; and the F of a prospective
 * litter (or the kinship of two animals) is the row of a *virtual offspring* of the two, traced over
 * their ancestors only, never the whole pedigree.
 *
 * All values are sums of products of powers of ½ and stay exact in doubles for pedigrees of ordinary
 * depth; the tabular method (additive relationship matrix) is kept as an independent check.
 */
import { ancestorClosure, indexPedigree, type PedigreeAnimal, type PedigreeIndex } from './pedigree-index';
import { TraceKernel } from './trace-kernel';

/** Precomputed F by animal id, e.g. the result of `inbreedingCoefficients` on the same pedigree. */
export type InbreedingById = ReadonlyMap<string, number>;

/** Working buffers of the Meuwissen–Luo trace over one indexed pedigree, reused across rows. */
class MeuwissenLuo {
  readonly kernel: TraceKernel;

  constructor(private readonly index: PedigreeIndex) {
    this.kernel = new TraceKernel(index.size);
    for (let position = 0; position < index.size; position++) this.kernel.place(position, index.sire[position]!, index.dam[position]!);
  }

  get f(): Float64Array {
    return this.kernel.f;
  }

  offspringF(s: number, dm: number): number {
    return this.kernel.offspringF(s, dm);
  }

  /** F of every position, in topological order; full sibs share one trace. */
  computeAll(): void {
    this.kernel.settleRange(0, this.index.size);
  }

  /**
   * F of the given positions and all their ancestors only, taking precomputed values where given
   * (except at positions marked in `recompute`).
   */
  computeAncestors(start: ReadonlyArray<number>, precomputed?: InbreedingById, recompute?: Uint8Array): void {
    const closure = ancestorClosure(this.index, start, this.kernel.known);
    const { ids, sire, dam } = this.index;
    for (const position of closure) {
      const given = recompute?.[position] ? undefined : precomputed?.get(ids[position]!);
      this.kernel.settle(position, given ?? this.kernel.offspringF(sire[position]!, dam[position]!));
    }
  }
}

/**
 * F of every listed animal (an entry for each listed id, in input order).
 * Rows may come in any order; an id named as a parent but not listed is one founder (F = 0, unknown
 * parents) shared by every row naming it; the same animal may be both sire and dam. Throws on an id
 * listed twice (`PedigreeDuplicateError`) and on a cycle (`PedigreeCycleError`, naming an animal in it).
 */
export function inbreedingCoefficients(
  animals: ReadonlyArray<{ id: string; sireId: string | null; damId: string | null }>,
): Map<string, number> {
  const index = indexPedigree(animals);
  const kernel = new MeuwissenLuo(index);
  kernel.computeAll();
  const result = new Map<string, number>();
  for (let row = 0; row < animals.length; row++) {
    result.set(animals[row]!.id, kernel.f[index.positionOfRow[row]!]!);
  }
  return result;
}

/**
 * Kinship (coefficient of coancestry) f_ab = a_ab / 2: the probability that an allele drawn at random
 * from `a` and one from `b` are identical by descent. f_aa = (1 + F_a) / 2. An id the pedigree does
 * not know is a founder unrelated to everyone else. Traces the two animals' ancestors only;
 * `precomputedF` (from `inbreedingCoefficients` on the same pedigree) saves recomputing their F.
 */
export function kinship(
  animals: ReadonlyArray<PedigreeAnimal>,
  a: string,
  b: string,
  precomputedF?: InbreedingById,
): number {
  return offspringInbreeding(animals, a, b, precomputedF);
}

/**
 * F of a prospective litter of `sireId` × `damId`, which is the kinship of the two parents.
 * Sire or dam ids that are not in the list are founders. Traces the parents' ancestors only;
 * `precomputedF` (from `inbreedingCoefficients` on the same pedigree) saves recomputing their F.
 * Throws on a duplicate row or a cycle anywhere in the list, like `inbreedingCoefficients`.
 */
export function offspringInbreeding(
  animals: ReadonlyArray<{ id: string; sireId: string | null; damId: string | null }>,
  sireId: string,
  damId: string,
  precomputedF?: InbreedingById,
): number {
  const index = indexPedigree(animals);
  const s = index.positionOf(sireId);
  const dm = index.positionOf(damId);
  if (s < 0 || dm < 0) return sireId === damId ? 0.5 : 0;
  const kernel = new MeuwissenLuo(index);
  kernel.computeAncestors([s, dm], precomputedF);
  return kernel.offspringF(s, dm);
}

/**
 * F of the litter of one doe with each candidate buck, for ranking bucks: one index of the pedigree,
 * F of the ancestors of the doe and the bucks (or taken from `precomputedF`), then one trace per buck
 * over the two animals' ancestors. Bucks the pedigree does not know are unrelated founders (F = 0).
 */
export function offspringInbreedingMany(
  animals: ReadonlyArray<PedigreeAnimal>,
  damId: string,
  sireIds: ReadonlyArray<string>,
  precomputedF?: InbreedingById,
): Map<string, number> {
  const index = indexPedigree(animals);
  const dm = index.positionOf(damId);
  const sires = sireIds.map((id) => index.positionOf(id));
  const result = new Map<string, number>();
  const kernel = new MeuwissenLuo(index);
  kernel.computeAncestors(dm < 0 ? sires : [dm, ...sires], precomputedF);
  sireIds.forEach((sireId, i) => {
    const s = sires[i]!;
    result.set(sireId, s < 0 || dm < 0 ? (sireId === damId ? 0.5 : 0) : kernel.offspringF(s, dm));
  });
  return result;
}

/**
 * Brings stored F up to date after a change, without recomputing the whole pedigree: recomputes the
 * animals in `changedIds` (e.g. one whose sire or dam was edited), every listed animal missing from
 * `storedF` (e.g. a new litter), and all their descendants, tracing only their ancestors and taking
 * everyone else's F from `storedF`. Returns the new F of exactly those animals (listed ones only);
 * all other stored values stay valid. `storedF` must come from this pedigree before the change.
 */
export function recomputeInbreeding(
  animals: ReadonlyArray<PedigreeAnimal>,
  storedF: InbreedingById,
  changedIds: Iterable<string>,
): Map<string, number> {
  const index = indexPedigree(animals);
  const { size, sire, dam, rowOf } = index;
  const affected = new Uint8Array(size);
  for (const id of changedIds) {
    const position = index.positionOf(id);
    if (position >= 0) affected[position] = 1;
  }
  for (let row = 0; row < animals.length; row++) {
    if (!storedF.has(animals[row]!.id)) affected[index.positionOfRow[row]!] = 1;
  }
  // Positions are topological, so one ascending pass marks every descendant.
  const start: number[] = [];
  for (let position = 0; position < size; position++) {
    const s = sire[position]!;
    const d = dam[position]!;
    if (affected[position] || (s >= 0 && affected[s]) || (d >= 0 && affected[d])) {
      affected[position] = 1;
      start.push(position);
    }
  }
  const kernel = new MeuwissenLuo(index);
  kernel.computeAncestors(start, storedF, affected);
  const result = new Map<string, number>();
  for (const position of start) {
    const row = rowOf[position]!;
    if (row >= 0) result.set(animals[row]!.id, kernel.f[position]!);
  }
  return result;
}
