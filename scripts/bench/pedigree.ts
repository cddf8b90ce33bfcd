// Pedigree benchmark on a generated, co-op-shaped pedigree of 100,000 animals (invented data):
// 50 farms each keeping about 30 does and 3 bucks as breeders at a time; every round each doe is bred
// (mostly to a buck of her own farm, about 25 % to another farm's buck) and has a recorded litter of
// 1–6 kits; about 12 % of kits are kept and, once grown, replace a culled breeder of their sex; now and
// then a farm brings in an outside animal from papers (about 2 % of all animals with the starting
// stock and the parents named on papers; a few of those parents are named but not listed). Rows are shuffled (a database returns them
// in no particular order). Seeded, so every run builds the same pedigree.
// Run: `npm run bench pedigree` (or `node --import tsx scripts/bench/pedigree.ts`).
import { performance } from 'node:perf_hooks';
import {
  breedMakeupAll, inbreedingCoefficients, offspringBreedMakeupMany, offspringInbreedingMany, pedigreeCompletenessAll,
  recomputeInbreeding, type BreedAnimal,
} from '@burrowline/shared';
import { CoopPedigree } from '../../packages/shared/src/pedigree/coop-pedigree';
import { indexPedigree } from '../../packages/shared/src/pedigree/pedigree-index';
import { TraceKernel } from '../../packages/shared/src/pedigree/trace-kernel';
import { plainMeuwissenLuo } from './pedigree-bench/plain-meuwissen-luo';
import { pick, randomInt, seededRandom, shuffled, type Random } from '../../packages/shared/src/pedigree/seeded-random';

// BENCH_PEDIGREE_ANIMALS=300000 shows how the cost grows with more generations of records.
const TOTAL = Number(process.env.BENCH_PEDIGREE_ANIMALS ?? 100_000);
const FARMS = 50;
const DOES_PER_FARM = 30;
const BUCKS_PER_FARM = 3;
const OTHER_FARM_BUCK = 0.25;
const KEEP_KIT = 0.12;
const ROUNDS_TO_MATURITY = 2; // ≈ 4–5 months at about one litter every 2 months
const OUTSIDE_PER_FARM_ROUND = 0.33;
const OUTSIDE_PARENTS_ON_PAPERS = 0.3;
const CANDIDATE_BUCKS = 150;
const RUNS = 5;
const BREEDS = ['New Zealand', 'Californian', 'Silver Fox', 'Champagne d\'Argent', 'American Chinchilla', 'Satin', 'Rex', 'Palomino'];

interface Farm {
  breed: string;
  does: string[];
  bucks: string[];
  growing: { id: string; sex: 'buck' | 'doe'; readyAt: number }[];
}

function uuid(random: Random): string {
  const hex = () => Math.floor(random() * 0x100000000).toString(16).padStart(8, '0');
  const h = hex() + hex() + hex() + hex();
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-a${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

function generateCoop(seed: number) {
  const random = seededRandom(seed);
  const rows: BreedAnimal[] = [];
  let outside = 0;
  let offFarmMatings = 0;
  let matings = 0;
  const outsideAnimal = (breed: string, sireId: string | null = null, damId: string | null = null): string => {
    const id = uuid(random);
    rows.push({ id, sireId, damId, declaredBreed: random() < 0.97 ? breed : null });
    outside++;
    return id;
  };
  // Parents named on the papers of several bought-in animals: most are in the outside registry with
  // their breed, a few only by name (named but not listed: one founder of unknown breed).
  const paperParents = (count: number) => Array.from({ length: count }, (_, i) => (i < count - 4 ? outsideAnimal(pick(random, BREEDS)) : uuid(random)));
  const paperSires = paperParents(30);
  const paperDams = paperParents(60);
  const boughtIn = (breed: string) =>
    random() < OUTSIDE_PARENTS_ON_PAPERS ? outsideAnimal(breed, pick(random, paperSires), pick(random, paperDams)) : outsideAnimal(breed);
  const farms: Farm[] = Array.from({ length: FARMS }, (_, f) => {
    const breed = BREEDS[f % BREEDS.length]!;
    return {
      breed,
      does: Array.from({ length: DOES_PER_FARM }, () => boughtIn(random() < 0.8 ? breed : pick(random, BREEDS))),
      bucks: Array.from({ length: BUCKS_PER_FARM }, () => boughtIn(random() < 0.8 ? breed : pick(random, BREEDS))),
      growing: [],
    };
  });
  const homeBred: string[] = [];
  const replace = (farm: Farm, sex: 'buck' | 'doe', id: string) => {
    const breeders = sex === 'buck' ? farm.bucks : farm.does;
    breeders[Math.floor(random() * breeders.length)] = id;
  };
  let round = 0;
  while (rows.length < TOTAL) {
    round++;
    for (const farm of farms) {
      farm.growing = farm.growing.filter((young) => {
        if (young.readyAt > round) return true;
        replace(farm, young.sex, young.id);
        homeBred.push(young.id);
        return false;
      });
      if (random() < OUTSIDE_PER_FARM_ROUND) {
        const sex = random() < 0.5 ? 'buck' : 'doe';
        replace(farm, sex, boughtIn(random() < 0.7 ? farm.breed : pick(random, BREEDS)));
      }
    }
    for (const farm of farms) {
      for (const dam of farm.does) {
        if (rows.length >= TOTAL) break;
        const offFarm = random() < OTHER_FARM_BUCK;
        const sire = pick(random, offFarm ? pick(random, farms.filter((other) => other !== farm)).bucks : farm.bucks);
        matings++;
        if (offFarm) offFarmMatings++;
        const kits = randomInt(random, 1, 6);
        for (let k = 0; k < kits && rows.length < TOTAL; k++) {
          const id = uuid(random);
          rows.push({ id, sireId: sire, damId: dam, declaredBreed: null });
          if (random() < KEEP_KIT) {
            const sex = random() < BUCKS_PER_FARM / (BUCKS_PER_FARM + DOES_PER_FARM) ? 'buck' : 'doe';
            farm.growing.push({ id, sex, readyAt: round + ROUNDS_TO_MATURITY });
          }
        }
      }
    }
  }
  const doe = pick(random, pick(random, farms).does);
  const bucks = farms.flatMap((farm) => farm.bucks).slice(0, CANDIDATE_BUCKS);
  return { rows: shuffled(random, rows), outside, matings, offFarmMatings, rounds: round, doe, bucks, earlyBreeder: homeBred[0]! };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

function time<T>(work: () => T): { ms: number; result: T } {
  work(); // warm-up
  const times: number[] = [];
  let result!: T;
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    result = work();
    times.push(performance.now() - t0);
  }
  return { ms: median(times), result };
}

/** Longest line of ancestry (generations back to a founder), for context. */
function depth(list: ReadonlyArray<BreedAnimal>, order: ReadonlyArray<string>): number {
  const parents = new Map(list.map((row) => [row.id, row]));
  const generation = new Map<string, number>();
  for (const id of order) {
    const row = parents.get(id)!;
    const of = (parent: string | null) => (parent === null ? 0 : (generation.get(parent) ?? 0) + 1);
    generation.set(id, Math.max(of(row.sireId), of(row.damId)));
  }
  return Math.max(...generation.values());
}

/** Two pieces of work timed in turn (a warm-up each, then 2 × RUNS + 1 runs each), medians. */
function alternate<A, B>(a: () => A, b: () => B): [{ ms: number; result: A }, { ms: number; result: B }] {
  let resultA = a();
  let resultB = b();
  const timesA: number[] = [];
  const timesB: number[] = [];
  for (let i = 0; i < 2 * RUNS + 1; i++) {
    let t0 = performance.now();
    resultA = a();
    timesA.push(performance.now() - t0);
    t0 = performance.now();
    resultB = b();
    timesB.push(performance.now() - t0);
  }
  return [{ ms: median(timesA), result: resultA }, { ms: median(timesB), result: resultB }];
}

const fmt = (ms: number) => `${ms.toFixed(1)} ms`;
const t0 = performance.now();
const coop = generateCoop(20240601);
const generated = performance.now() - t0;
const { rows } = coop;

const inbreeding = time(() => inbreedingCoefficients(rows));
const f = inbreeding.result;
let sum = 0;
let max = 0;
let inbred = 0;
for (const value of f.values()) {
  sum += value;
  if (value > max) max = value;
  if (value > 0) inbred++;
}
const indexing = time(() => indexPedigree(rows));
// The yardstick: Meuwissen & Luo as the paper gives it, on the same indexed pedigree (typed arrays),
// against the kernel every pedigree computation here uses (generation order, full sibs traced once).
const plainIndex = indexPedigree(rows);
const kernelAll = () => {
  const kernel = new TraceKernel(plainIndex.size);
  for (let position = 0; position < plainIndex.size; position++) kernel.place(position, plainIndex.sire[position]!, plainIndex.dam[position]!);
  kernel.settleRange(0, plainIndex.size);
  return kernel;
};
// Alternated run by run, so a busy machine slows both alike.
const [plain, kernelOnly] = alternate(() => plainMeuwissenLuo(plainIndex), kernelAll);
// The same, end to end from the list of rows (reading the ids into an index included).
const [plainFromRows, oursFromRows] = alternate(() => plainMeuwissenLuo(indexPedigree(rows)), () => CoopPedigree.build(rows));
let plainDifference = 0;
for (let row = 0; row < rows.length; row++) {
  plainDifference = Math.max(plainDifference, Math.abs(plain.result[plainIndex.positionOfRow[row]!]! - f.get(rows[row]!.id)!));
}
// The co-op's kept pedigree: built once, then kinship of one doe with 200 bucks, and updates in place.
const kept = time(() => CoopPedigree.build(rows));
const pedigreeIndex = kept.result;
const twoHundred = [...coop.bucks, ...rows.filter((row) => !coop.bucks.includes(row.id)).slice(0, 200 - coop.bucks.length).map((row) => row.id)];
const keptKinship = time(() => pedigreeIndex.offspringInbreedingMany(coop.doe, twoHundred));
const updates: number[] = [];
const corrections: number[] = [];
const earlyRow = rows.find((row) => row.id === coop.earlyBreeder)!;
for (let run = 0; run <= RUNS; run++) {
  let t = performance.now();
  pedigreeIndex.apply(Array.from({ length: 6 }, (_, k) => ({ id: `kept-kit-${run}-${k}`, sireId: coop.bucks[run % coop.bucks.length]!, damId: coop.doe })));
  if (run > 0) updates.push(performance.now() - t);
  t = performance.now();
  pedigreeIndex.apply([{ id: earlyRow.id, sireId: earlyRow.sireId, damId: run % 2 === 0 ? null : earlyRow.damId }]);
  if (run > 0) corrections.push(performance.now() - t);
}
pedigreeIndex.apply([{ id: earlyRow.id, sireId: earlyRow.sireId, damId: earlyRow.damId }]);
const full = inbreedingCoefficients(pedigreeIndex.rows());
let keptDifference = 0;
for (const [id, value] of pedigreeIndex.inbreedingAll()) keptDifference = Math.max(keptDifference, Math.abs(value - full.get(id)!));
const ranking = time(() => offspringInbreedingMany(rows, coop.doe, coop.bucks, f));
const rankingCold = time(() => offspringInbreedingMany(rows, coop.doe, coop.bucks));
// A new litter of 6 kits recorded, and the dam of an early home-bred breeder corrected (all its
// descendants change).
const litter = [...rows, ...Array.from({ length: 6 }, (_, k) => ({ id: `new-kit-${k}`, sireId: coop.bucks[0]!, damId: coop.doe, declaredBreed: null }))];
const newLitter = time(() => recomputeInbreeding(litter, f, []));
const early = rows.find((row) => row.id === coop.earlyBreeder)!;
const corrected = rows.map((row) => (row === early ? { ...row, damId: null } : row));
const correction = time(() => recomputeInbreeding(corrected, f, [early.id]));
const makeupRanking = time(() => offspringBreedMakeupMany(rows, coop.doe, coop.bucks));
const makeup = time(() => breedMakeupAll(rows));
const completeness = time(() => pedigreeCompletenessAll(rows, 4));

const purity = new Map<string, number>();
for (const m of makeup.result.values()) purity.set(m.purity, (purity.get(m.purity) ?? 0) + 1);
const ranked = [...ranking.result.entries()].sort((a, b) => a[1] - b[1]);

console.log(`co-op pedigree: ${rows.length.toLocaleString('en-US')} animals in ${coop.rounds} breeding rounds on ${FARMS} farms ` +
  `(generated in ${fmt(generated)}, seed 20240601)`);
console.log(`  outside animals ${coop.outside} (${((100 * coop.outside) / rows.length).toFixed(1)} %), matings ${coop.matings}, ` +
  `with another farm's buck ${((100 * coop.offFarmMatings) / coop.matings).toFixed(1)} %`);
console.log(`machine: ${process.version}, ${(await import('node:os')).cpus().length} cores; median of ${RUNS} runs after a warm-up`);
console.log('');
console.log(`inbreedingCoefficients, all animals   ${fmt(inbreeding.ms).padStart(10)}  ` +
  `(${Math.round(rows.length / (inbreeding.ms / 1000)).toLocaleString('en-US')} animals/s; goal < 1 s: ${inbreeding.ms < 1000 ? 'met' : 'NOT met'})`);
console.log(`  of which reading the list into a topological index ${fmt(indexing.ms)}`);
console.log(`F of all animals on the indexed pedigree: plain Meuwissen & Luo (1992) as the paper gives it ${fmt(plain.ms)}, ` +
  `ours ${fmt(kernelOnly.ms)} → ${(plain.ms / kernelOnly.ms).toFixed(1)} × faster (goal ≥ 3 ×: ${plain.ms / kernelOnly.ms >= 3 ? 'met' : 'NOT met'}); ` +
  `largest difference in F ${plainDifference.toExponential(1)}`);
console.log(`  from the list of rows, index included: plain ${fmt(plainFromRows.ms)}, ours (the co-op pedigree's build) ${fmt(oursFromRows.ms)} → ` +
  `${(plainFromRows.ms / oursFromRows.ms).toFixed(1)} × (reading string ids into the index is most of both)`);
console.log(`co-op pedigree kept in memory: built in ${fmt(kept.ms)}; litter F of one doe × ${twoHundred.length} bucks ${fmt(keptKinship.ms)} ` +
  `(goal < 50 ms: ${keptKinship.ms < 50 ? 'met' : 'NOT met'})`);
console.log(`  updated in place: a new litter of 6 kits ${fmt(median(updates))}, one breeder's dam corrected ${fmt(median(corrections))}; ` +
  `largest difference from a full recompute ${keptDifference.toExponential(1)}`);
console.log(`  F: mean ${(sum / f.size).toFixed(4)}, max ${max.toFixed(4)}, inbred (F > 0) ${((100 * inbred) / f.size).toFixed(1)} %`);
console.log(`offspringInbreedingMany, ${coop.bucks.length} bucks × 1 doe, with stored F  ${fmt(ranking.ms).padStart(10)}`);
console.log(`offspringInbreedingMany, ${coop.bucks.length} bucks × 1 doe, no stored F    ${fmt(rankingCold.ms).padStart(10)}`);
console.log(`  litter F of the doe's 3 closest and 3 least related bucks: ` +
  `${[...ranked.slice(-3).reverse(), ...ranked.slice(0, 3)].map(([, v]) => v.toFixed(4)).join(', ')}`);
console.log(`recomputeInbreeding, a new litter of 6 kits             ${fmt(newLitter.ms).padStart(10)}`);
console.log(`recomputeInbreeding, one breeder's dam corrected (${correction.result.size} animals change) ${fmt(correction.ms).padStart(10)}`);
console.log(`breedMakeupAll, all animals            ${fmt(makeup.ms).padStart(10)}  ` +
  `(${[...purity].map(([k, v]) => `${k} ${((100 * v) / rows.length).toFixed(1)} %`).join(', ')})`);
console.log(`offspringBreedMakeupMany, ${coop.bucks.length} bucks × 1 doe      ${fmt(makeupRanking.ms).padStart(10)}`);
console.log(`pedigreeCompletenessAll, 4 generations ${fmt(completeness.ms).padStart(10)}`);
console.log(`deepest line: ${depth(rows, topological(rows))} generations`);

/** Ids in an order with parents first (plain iterative sort, for the depth figure only). */
function topological(list: ReadonlyArray<BreedAnimal>): string[] {
  const byId = new Map(list.map((row) => [row.id, row]));
  const done = new Set<string>();
  const out: string[] = [];
  for (const start of list) {
    const stack = [start.id];
    while (stack.length > 0) {
      const id = stack[stack.length - 1]!;
      if (done.has(id)) {
        stack.pop();
        continue;
      }
      const row = byId.get(id);
      const pending = [row?.sireId, row?.damId].filter((p): p is string => p != null && byId.has(p) && !done.has(p));
      if (pending.length > 0) {
        stack.push(...pending);
        continue;
      }
      done.add(id);
      out.push(id);
      stack.pop();
    }
  }
  return out;
}
