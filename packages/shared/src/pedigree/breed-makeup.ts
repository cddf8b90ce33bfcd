/**
 * Breed make-up computed down the pedigree: each animal is half its sire's make-up and half its dam's.
 *
 * Rules (decided here; shown to breeders as such):
 * - An animal with neither parent known is 100 % its declared breed, or 100 % unknown without one.
 * - A known parent passes on its whole make-up at one half; an unknown parent passes on one half of
 *   **unknown** ancestry. The animal's own declared breed does not fill that half: a declaration is a
 *   claim, not a record, and ancestry that is not recorded is exactly what makes stock unpredictable.
 *   To record a known breed for a missing parent, enter that parent (e.g. as an outside animal from
 *   papers, with its breed).
 * - A declared breed is therefore used only for animals entered without parents; with parents, the
 *   computed make-up wins.
 * - A parent named but not listed is an unknown-ancestry founder (no breed is known for it).
 * - Purity: `purebred` = one breed at 100 %; `known_cross` = two or more breeds, nothing unknown;
 *   `partly_unknown` = some but not all unknown; `unknown` = 100 % unknown.
 *
 * Fractions are dyadic (k / 2^g). They are kept as doubles, which hold them exactly for pedigrees up
 * to about 50 generations deep (53-bit significand); `asDyadicFraction` turns one back into k / 2^g.
 */
import { ancestorClosure, indexPedigree, type PedigreeAnimal, type PedigreeIndex } from './pedigree-index';

export type BreedPurity = 'purebred' | 'known_cross' | 'partly_unknown' | 'unknown';

export interface BreedMakeup {
  /** Fraction of each breed, largest first; an empty object when nothing is known. */
  breeds: Record<string, number>;
  /** Fraction of unknown ancestry, 0–1; with `breeds` it sums to 1. */
  unknown: number;
  purity: BreedPurity;
}

export interface BreedAnimal extends PedigreeAnimal {
  /** A breed name, or `null` = unknown. An empty string counts as unknown. */
  readonly declaredBreed: string | null;
}

/** Make-up of one animal as parallel arrays: breed codes ascending, with their fractions. */
interface Parts {
  codes: number[];
  fractions: number[];
  unknown: number;
  /** The presented form, made once and shared by every animal with these parts (litter mates). */
  presented?: BreedMakeup;
}

const allUnknown = (): Parts => ({ codes: [], fractions: [], unknown: 1 });

function halfAndHalf(sire: Parts, dam: Parts): Parts {
  const codes: number[] = [];
  const fractions: number[] = [];
  let i = 0;
  let j = 0;
  while (i < sire.codes.length || j < dam.codes.length) {
    const a = i < sire.codes.length ? sire.codes[i]! : Infinity;
    const b = j < dam.codes.length ? dam.codes[j]! : Infinity;
    if (a === b) {
      codes.push(a);
      fractions.push(0.5 * sire.fractions[i++]! + 0.5 * dam.fractions[j++]!);
    } else if (a < b) {
      codes.push(a);
      fractions.push(0.5 * sire.fractions[i++]!);
    } else {
      codes.push(b);
      fractions.push(0.5 * dam.fractions[j++]!);
    }
  }
  return { codes, fractions, unknown: 0.5 * sire.unknown + 0.5 * dam.unknown };
}

function purityOf(breedCount: number, unknown: number): BreedPurity {
  if (unknown >= 1) return 'unknown';
  if (unknown > 0) return 'partly_unknown';
  return breedCount === 1 ? 'purebred' : 'known_cross';
}

/** Largest fraction first, then by breed name (plain code-unit order, the same on every machine). */
function byFractionThenName(a: readonly [string, number], b: readonly [string, number]): number {
  return b[1] - a[1] || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0);
}

function freeze(breeds: Record<string, number>, unknown: number, purity: BreedPurity): BreedMakeup {
  return Object.freeze({ breeds: Object.freeze(breeds), unknown, purity });
}

function present(parts: Parts, breedNames: readonly string[]): BreedMakeup {
  const entries = parts.codes.map((code, k): [string, number] => [breedNames[code]!, parts.fractions[k]!]);
  if (entries.length > 1) entries.sort(byFractionThenName);
  const breeds: Record<string, number> = {};
  for (const [breed, fraction] of entries) breeds[breed] = fraction;
  return freeze(breeds, parts.unknown, purityOf(entries.length, parts.unknown));
}

class MakeupBuilder {
  readonly parts: (Parts | undefined)[];
  readonly breedNames: string[] = [];
  private readonly codeOf = new Map<string, number>();
  private readonly unknownParts = allUnknown();
  /** Parts of a purebred founder by breed code, and of an offspring by parent pair. */
  private readonly founderParts: Parts[] = [];
  private readonly byParents = new Map<number, Parts>();

  constructor(
    private readonly index: PedigreeIndex,
    private readonly animals: ReadonlyArray<BreedAnimal>,
  ) {
    this.parts = new Array<Parts | undefined>(index.size);
  }

  private purebred(breed: string): Parts {
    let code = this.codeOf.get(breed);
    if (code === undefined) {
      code = this.breedNames.length;
      this.codeOf.set(breed, code);
      this.breedNames.push(breed);
      this.founderParts.push({ codes: [code], fractions: [1], unknown: 0 });
    }
    return this.founderParts[code]!;
  }

  private of(position: number): Parts {
    return position < 0 ? this.unknownParts : this.parts[position]!;
  }

  /** Make-up at `position`; both parents' make-up must already be known (parents come first). */
  settle(position: number): void {
    const s = this.index.sire[position]!;
    const d = this.index.dam[position]!;
    let parts: Parts;
    if (s < 0 && d < 0) {
      const row = this.index.rowOf[position]!;
      const breed = row < 0 ? null : this.animals[row]!.declaredBreed;
      parts = breed == null || breed === '' ? this.unknownParts : this.purebred(breed);
    } else {
      // Litter mates share one make-up; -1 (unknown) shifts to 0 so the key stays unique.
      const key = (s + 1) * (this.index.size + 1) + (d + 1);
      const cached = this.byParents.get(key);
      if (cached) {
        parts = cached;
      } else {
        parts = halfAndHalf(this.of(s), this.of(d));
        this.byParents.set(key, parts);
      }
    }
    this.parts[position] = parts;
  }

  /** Make-up of the given positions, computing only them and their ancestors. */
  settleAncestors(start: ReadonlyArray<number>): void {
    const closure = ancestorClosure(this.index, start, new Uint8Array(this.index.size));
    for (const position of closure) this.settle(position);
  }

  at(position: number): BreedMakeup {
    const parts = this.of(position);
    parts.presented ??= present(parts, this.breedNames);
    return parts.presented;
  }

  offspring(sire: number, dam: number): BreedMakeup {
    return present(halfAndHalf(this.of(sire), this.of(dam)), this.breedNames);
  }
}

/**
 * Breed make-up of one animal, computed over its ancestors only. An id the pedigree does not know is
 * 100 % unknown. Throws on a duplicate row or a cycle, like `inbreedingCoefficients`.
 */
export function breedMakeup(animals: ReadonlyArray<BreedAnimal>, id: string): BreedMakeup {
  const index = indexPedigree(animals);
  const builder = new MakeupBuilder(index, animals);
  const position = index.positionOf(id);
  builder.settleAncestors([position]);
  return builder.at(position);
}

/**
 * Breed make-up of every listed animal, in one pass in topological order (linear time, memoised).
 * Results are frozen; litter mates (same sire and dam) share one object.
 */
export function breedMakeupAll(animals: ReadonlyArray<BreedAnimal>): Map<string, BreedMakeup> {
  const index = indexPedigree(animals);
  const builder = new MakeupBuilder(index, animals);
  for (let position = 0; position < index.size; position++) builder.settle(position);
  const result = new Map<string, BreedMakeup>();
  for (let row = 0; row < animals.length; row++) result.set(animals[row]!.id, builder.at(index.positionOfRow[row]!));
  return result;
}

/** Breed make-up of a prospective litter of `sireId` × `damId` (ids not in the list are unknown). */
export function offspringBreedMakeup(animals: ReadonlyArray<BreedAnimal>, sireId: string, damId: string): BreedMakeup {
  const index = indexPedigree(animals);
  const builder = new MakeupBuilder(index, animals);
  const s = index.positionOf(sireId);
  const d = index.positionOf(damId);
  builder.settleAncestors([s, d]);
  return builder.offspring(s, d);
}

/**
 * Breed make-up of the litter of one doe with each candidate buck (the trial-mating screen): one read of
 * the pedigree, make-up of the doe's and bucks' ancestors only. Ids not in the list are unknown.
 */
export function offspringBreedMakeupMany(
  animals: ReadonlyArray<BreedAnimal>,
  damId: string,
  sireIds: ReadonlyArray<string>,
): Map<string, BreedMakeup> {
  const index = indexPedigree(animals);
  const builder = new MakeupBuilder(index, animals);
  const d = index.positionOf(damId);
  const sires = sireIds.map((id) => index.positionOf(id));
  builder.settleAncestors([d, ...sires]);
  return new Map(sireIds.map((id, i) => [id, builder.offspring(sires[i]!, d)]));
}

/**
 * Make-up of a litter from the parents' make-ups (e.g. taken from `breedMakeupAll`), for comparing
 * many trial matings without re-reading the pedigree. `null` = unknown parent.
 */
export function combineBreedMakeup(sire: BreedMakeup | null, dam: BreedMakeup | null): BreedMakeup {
  const breeds: Record<string, number> = {};
  for (const parent of [sire, dam]) {
    if (parent === null) continue;
    for (const [breed, fraction] of Object.entries(parent.breeds)) breeds[breed] = (breeds[breed] ?? 0) + 0.5 * fraction;
  }
  const unknown = 0.5 * (sire?.unknown ?? 1) + 0.5 * (dam?.unknown ?? 1);
  const sorted = Object.entries(breeds).sort(byFractionThenName);
  return freeze(Object.fromEntries(sorted), unknown, purityOf(sorted.length, unknown));
}

/**
 * A dyadic fraction as numerator / 2^k in lowest terms, e.g. 0.375 → { numerator: 3, denominator: 8 },
 * for showing make-up as ⅜ rather than 37.5 %.
 */
export function asDyadicFraction(value: number): { numerator: number; denominator: number } {
  let numerator = value;
  let denominator = 1;
  while (!Number.isInteger(numerator) && denominator < 2 ** 60) {
    numerator *= 2;
    denominator *= 2;
  }
  return { numerator: Math.round(numerator), denominator };
}
