/**
 * Ranking the co-op's offered bucks for one doe (the Stud Share finder), over the co-op's pedigree kept
 * in memory: for each buck, the litter's COI (the kinship of the two), the litter's breed make-up (half
 * each parent's) and the nearest ancestors the two share. Pure: the server ranks with it and the bench
 * measures it.
 *
 * Default order: lowest litter COI first (avoiding inbreeding is why a small herd borrows a buck), then
 * a known breed make-up (purebred or a known cross before partly unknown), then his get's growth (mean
 * daily gain, fastest first), then the buck's label, so the order is stable.
 */
import { combineBreedMakeup, type BreedMakeup, type BreedPurity } from './breed-makeup';
import type { CoopPedigree } from './coop-pedigree';

/** Litter COI closer than this counts as equal (they are sums of powers of ½; this only absorbs rounding). */
const COI_EPSILON = 1e-9;
/** Generations searched for shared ancestors, and how many of the nearest are named. */
const SHARED_ANCESTOR_GENERATIONS = 5;
const SHARED_ANCESTORS_NAMED = 6;

export interface StudCandidate {
  buckId: string;
  /** How the explanation names him ("Bramble (NZ-12)"). */
  label: string;
  makeup: BreedMakeup | null;
  /** Mean daily gain of his get, g/day; null when not enough records. */
  getDailyGainGrams: number | null;
}

export type LitterMakeupClassOf = Exclude<BreedPurity, 'unknown'>;

export interface RankedStud<T extends StudCandidate> {
  candidate: T;
  rank: number;
  litterCoi: number;
  litterMakeup: BreedMakeup;
  makeupClass: LitterMakeupClassOf;
  /** Nearest shared ancestors, closest first. */
  sharedAncestorIds: string[];
  explanation: string;
}

export const STUD_ORDER_EXPLAINED = 'Lowest litter COI first, then a known breed make-up, then his get\'s growth.';

/** Purebred and known crosses are "known"; anything with unknown ancestry is not. */
export function litterMakeupClass(makeup: BreedMakeup): LitterMakeupClassOf {
  return makeup.purity === 'unknown' ? 'partly_unknown' : makeup.purity;
}

const knownness = (c: LitterMakeupClassOf) => (c === 'partly_unknown' ? 1 : 0);

/** Ancestors of `id` up to `depth` generations, each with the generation it is first met in (0: itself). */
export function ancestorDepths(pedigree: CoopPedigree, id: string, depth: number): Map<string, number> {
  const found = new Map<string, number>([[id, 0]]);
  let frontier = [id];
  for (let g = 1; g <= depth && frontier.length > 0; g++) {
    const next: string[] = [];
    for (const current of frontier) {
      const row = pedigree.parentsOf(current);
      if (!row) continue;
      for (const parent of [row.sireId, row.damId]) {
        if (parent && !found.has(parent)) {
          found.set(parent, g);
          next.push(parent);
        }
      }
    }
    frontier = next;
  }
  return found;
}

/**
 * The nearest ancestors two animals share (an ancestor behind another shared one is left out), closest
 * first by the generations to both. `damDepths` lets a caller comparing one doe with many reuse hers.
 */
export function sharedAncestors(
  pedigree: CoopPedigree,
  damDepths: ReadonlyMap<string, number>,
  sireId: string,
  depth = SHARED_ANCESTOR_GENERATIONS,
  max = SHARED_ANCESTORS_NAMED,
): string[] {
  const sireDepths = ancestorDepths(pedigree, sireId, depth);
  const common = [...sireDepths.keys()].filter((id) => damDepths.has(id));
  if (common.length === 0) return [];
  const isParentOf = (parent: string, child: string) => {
    const parents = pedigree.parentsOf(child);
    return parents?.sireId === parent || parents?.damId === parent;
  };
  const nearest = common.filter((id) => !common.some((other) => other !== id && isParentOf(id, other)));
  const distance = (id: string) => sireDepths.get(id)! + damDepths.get(id)!;
  return nearest.sort((a, b) => distance(a) - distance(b)).slice(0, max);
}

const percent = (coi: number) => `${(coi * 100).toFixed(1)} %`;
const classWords: Record<LitterMakeupClassOf, string> = { purebred: 'purebred', known_cross: 'a known cross', partly_unknown: 'partly unknown make-up' };

function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th';
  return `${n}${suffix}`;
}

function compareRows<T extends StudCandidate>(a: RankedStud<T>, b: RankedStud<T>): number {
  if (Math.abs(a.litterCoi - b.litterCoi) > COI_EPSILON) return a.litterCoi - b.litterCoi;
  const known = knownness(a.makeupClass) - knownness(b.makeupClass);
  if (known !== 0) return known;
  const ga = a.candidate.getDailyGainGrams;
  const gb = b.candidate.getDailyGainGrams;
  if (ga !== gb) {
    if (ga === null) return 1;
    if (gb === null) return -1;
    return gb - ga;
  }
  return a.candidate.label.localeCompare(b.candidate.label) || a.candidate.buckId.localeCompare(b.candidate.buckId);
}

/** One line saying why a row stands after the one above it (or that it leads). */
function explain<T extends StudCandidate>(row: RankedStud<T>, above: RankedStud<T> | undefined): string {
  const coi = `litter COI ${percent(row.litterCoi)}`;
  const growth = row.candidate.getDailyGainGrams === null ? 'no growth record for his get yet' : `his get gain ${row.candidate.getDailyGainGrams.toFixed(0)} g/day`;
  if (!above) return `1st: ${coi}, the lowest offered; ${classWords[row.makeupClass]}; ${growth}.`;
  const place = ordinal(row.rank);
  const prior = ordinal(above.rank);
  if (Math.abs(row.litterCoi - above.litterCoi) > COI_EPSILON) {
    return `${place}: ${coi}, higher than ${prior}'s ${percent(above.litterCoi)}; ${classWords[row.makeupClass]}; ${growth}.`;
  }
  if (knownness(row.makeupClass) !== knownness(above.makeupClass)) {
    return `${place}: ${coi} like ${prior}, but ${classWords[row.makeupClass]} where ${prior} is known; ${growth}.`;
  }
  if (row.candidate.getDailyGainGrams !== above.candidate.getDailyGainGrams) {
    const aboveGain = above.candidate.getDailyGainGrams;
    return `${place}: ${coi} and ${classWords[row.makeupClass]} like ${prior}; ${growth}${aboveGain === null ? '' : `, below ${prior}'s ${aboveGain.toFixed(0)} g/day`}.`;
  }
  return `${place}: level with ${prior} on COI, make-up and growth; listed by name.`;
}

/**
 * Ranks `candidates` for the doe `damId` in the default order and explains each place in one line.
 * A buck or doe the pedigree does not know counts as an unrelated founder (COI 0 with anyone).
 */
export function rankStuds<T extends StudCandidate>(
  pedigree: CoopPedigree,
  dam: { id: string; makeup: BreedMakeup | null },
  candidates: ReadonlyArray<T>,
): RankedStud<T>[] {
  const coi = pedigree.offspringInbreedingMany(dam.id, candidates.map((c) => c.buckId));
  const damDepths = ancestorDepths(pedigree, dam.id, SHARED_ANCESTOR_GENERATIONS);
  const rows: RankedStud<T>[] = candidates.map((candidate) => {
    const litterMakeup = combineBreedMakeup(candidate.makeup, dam.makeup);
    return {
      candidate,
      rank: 0,
      litterCoi: Math.min(1, Math.max(0, coi.get(candidate.buckId) ?? 0)),
      litterMakeup,
      makeupClass: litterMakeupClass(litterMakeup),
      sharedAncestorIds: sharedAncestors(pedigree, damDepths, candidate.buckId),
      explanation: '',
    };
  });
  rows.sort(compareRows);
  rows.forEach((row, i) => {
    row.rank = i + 1;
    row.explanation = explain(row, rows[i - 1]);
  });
  return rows;
}
