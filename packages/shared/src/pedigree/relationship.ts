/** Parents of an animal as a pedigree knows them (undefined for an animal not in it). */
export type ParentsOf = (id: string) => { sireId: string | null; damId: string | null } | null | undefined;

const MAX_GENERATIONS = 4;

/** Every ancestor within `MAX_GENERATIONS`, with its nearest generation (the animal itself at 0). */
function ancestry(parentsOf: ParentsOf, id: string): Map<string, number> {
  const found = new Map<string, number>([[id, 0]]);
  let frontier = [id];
  for (let generation = 1; generation <= MAX_GENERATIONS && frontier.length > 0; generation++) {
    const next: string[] = [];
    for (const current of frontier) {
      const parents = parentsOf(current);
      for (const parent of [parents?.sireId, parents?.damId]) {
        if (parent && !found.has(parent)) {
          found.set(parent, generation);
          next.push(parent);
        }
      }
    }
    frontier = next;
  }
  return found;
}

const forebears = ['', 'sire', 'grandsire', 'great-grandsire', 'great-great-grandsire'];
const descendants = ['', 'son', 'grandson', 'great-grandson', 'great-great-grandson'];
const cousins = ['', 'first cousin', 'second cousin', 'third cousin'];
const removals = ['', 'once removed', 'twice removed', 'three times removed'];

/**
 * How a buck is related to a doe, in the words breeders and genealogists use ("her sire", "half-brother",
 * "first cousin", "first cousin once removed"), from their nearest shared ancestors within four generations.
 * The terms are the common genealogical ones (common practice): full siblings share both parents, half
 * siblings one; cousins of degree n share an ancestor n + 1 generations back on both sides; "removed"
 * counts the generations between them.
 */
export function relationshipInWords(parentsOf: ParentsOf, doeId: string, buckId: string): string {
  if (doeId === buckId) return 'the same animal';
  const doe = ancestry(parentsOf, doeId);
  const buck = ancestry(parentsOf, buckId);
  // One is the other's ancestor.
  const buckUp = doe.get(buckId);
  if (buckUp !== undefined) return `her ${forebears[buckUp] ?? 'ancestor'}`;
  const doeUp = buck.get(doeId);
  if (doeUp !== undefined) return `her ${descendants[doeUp] ?? 'descendant'}`;

  // The nearest shared ancestors: the smallest sum of generations.
  let nearest = Infinity;
  for (const [id, up] of doe) if (up > 0 && buck.has(id)) nearest = Math.min(nearest, up + buck.get(id)!);
  if (nearest === Infinity) return 'no shared ancestor on record';
  const shared = [...doe].filter(([id, up]) => up > 0 && buck.get(id) !== undefined && up + buck.get(id)! === nearest);
  const [, doeSteps] = shared[0]!;
  const buckSteps = nearest - doeSteps;
  // Full relations share a mated pair, half relations one animal of it.
  const half = shared.length < 2 ? 'half-' : '';
  if (doeSteps === 1 && buckSteps === 1) return `${half}brother`;
  if (doeSteps === 2 && buckSteps === 1) return `${half}uncle (a ${half}brother of one of her parents)`;
  if (doeSteps === 1 && buckSteps === 2) return `${half}nephew (a son of her ${half}sibling)`;
  const degree = Math.min(doeSteps, buckSteps) - 1;
  const removed = Math.abs(doeSteps - buckSteps);
  if (degree === 0) return removed === 2 ? `${half}great-${doeSteps > buckSteps ? 'uncle' : 'nephew'}` : 'a near relation';
  return [`${half}${cousins[degree] ?? `${degree}th cousin`}`, removals[removed] ?? ''].filter(Boolean).join(' ');
}
