// Stud Share finder benchmark on a generated, co-op-shaped pedigree of 50,000 animals (invented data):
// 50 farms each keeping about 30 does and 3 bucks at a time; every round each doe is bred (three times in
// four to a buck of her own farm) and has 1–6 kits; about 12 % of kits are kept and replace a breeder of
// their sex once grown; now and then a farm buys in an unrelated animal of its breed. 200 of the bucks that
// bred in the co-op are offered; one doe is ranked against all of them the way the finder does (litter COI
// over the whole pedigree kept in memory, litter make-up, shared ancestors, the order and its explanation).
// Seeded, so every run ranks the same. Run: `npm run bench stud-finder`.
import { performance } from 'node:perf_hooks';
import { breedMakeupAll, CoopPedigree, rankStuds, type BreedAnimal, type StudCandidate } from '@burrowline/shared';
import { pick, randomInt, seededRandom, shuffled } from '../../packages/shared/src/pedigree/seeded-random';

const TOTAL = Number(process.env.BENCH_STUD_ANIMALS ?? 50_000);
const OFFERED = 200;
const FARMS = 50;
const DOES_PER_FARM = 30;
const BUCKS_PER_FARM = 3;
const RUNS = 21;
const BREEDS = ['New Zealand', 'Californian', 'Silver Fox', 'Champagne d\'Argent', 'American Chinchilla', 'Satin', 'Rex', 'Palomino'];
/** The finder must answer within this (the budget for a whole request). */
const BUDGET_MS = 300;

function generate(seed: number) {
  const random = seededRandom(seed);
  let next = 0;
  const id = () => `a${(next++).toString(36).padStart(7, '0')}`;
  const rows: BreedAnimal[] = [];
  const bought = (breed: string) => {
    const animal = id();
    rows.push({ id: animal, sireId: null, damId: null, declaredBreed: random() < 0.95 ? breed : null });
    return animal;
  };
  const farms = Array.from({ length: FARMS }, (_, f) => {
    const breed = BREEDS[f % BREEDS.length]!;
    return {
      breed,
      does: Array.from({ length: DOES_PER_FARM }, () => bought(breed)),
      bucks: Array.from({ length: BUCKS_PER_FARM }, () => bought(breed)),
      growing: [] as { id: string; sex: 'buck' | 'doe'; readyAt: number }[],
    };
  });
  const everUsedBucks = new Set<string>();
  let round = 0;
  while (rows.length < TOTAL) {
    round++;
    for (const farm of farms) {
      farm.growing = farm.growing.filter((young) => {
        if (young.readyAt > round) return true;
        const list = young.sex === 'buck' ? farm.bucks : farm.does;
        list[Math.floor(random() * list.length)] = young.id;
        return false;
      });
      if (random() < 0.3) farm.bucks[Math.floor(random() * farm.bucks.length)] = bought(farm.breed);
    }
    for (const farm of farms) {
      for (const dam of farm.does) {
        if (rows.length >= TOTAL) break;
        const sire = pick(random, random() < 0.25 ? pick(random, farms.filter((other) => other !== farm)).bucks : farm.bucks);
        everUsedBucks.add(sire);
        for (let k = randomInt(random, 1, 6); k > 0 && rows.length < TOTAL; k--) {
          const kit = id();
          rows.push({ id: kit, sireId: sire, damId: dam, declaredBreed: null });
          if (random() < 0.12) farm.growing.push({ id: kit, sex: random() < 0.1 ? 'buck' : 'doe', readyAt: round + 2 });
        }
      }
    }
  }
  const current = farms.flatMap((farm) => farm.bucks);
  const earlier = [...everUsedBucks].filter((b) => !current.includes(b));
  const offered = [...current, ...shuffled(random, earlier)].slice(0, OFFERED);
  const doe = pick(random, pick(random, farms).does);
  return { rows: shuffled(random, rows), offered, doe, rounds: round };
}

function median(values: number[]): number {
  return [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
}

const t0 = performance.now();
const coop = generate(20261205);
const generatedMs = performance.now() - t0;
const t1 = performance.now();
const pedigree = CoopPedigree.build(coop.rows);
const builtMs = performance.now() - t1;
const makeups = breedMakeupAll(coop.rows);
const random = seededRandom(7);
const candidates: StudCandidate[] = coop.offered.map((buckId, i) => ({
  buckId, label: `Buck ${i + 1}`, makeup: makeups.get(buckId) ?? null, getDailyGainGrams: random() < 0.7 ? 25 + random() * 20 : null,
}));
const dam = { id: coop.doe, makeup: makeups.get(coop.doe) ?? null };

const cold = performance.now();
let ranked = rankStuds(pedigree, dam, candidates);
const coldMs = performance.now() - cold;
const times: number[] = [];
for (let run = 0; run < RUNS; run++) {
  const start = performance.now();
  ranked = rankStuds(pedigree, dam, candidates);
  times.push(performance.now() - start);
}
const rankMs = median(times);
const related = ranked.filter((row) => row.litterCoi > 0).length;

console.log(`pedigree: ${coop.rows.length.toLocaleString('en-US')} animals over ${coop.rounds} rounds (generated in ${generatedMs.toFixed(0)} ms, kept pedigree built in ${builtMs.toFixed(0)} ms, once per process)`);
console.log(`ranking ${candidates.length} offered bucks for one doe: first call ${coldMs.toFixed(1)} ms, median of ${RUNS} runs ${rankMs.toFixed(1)} ms (budget ${BUDGET_MS} ms for the whole request)`);
console.log(`  ${related} of ${ranked.length} bucks related to her; lowest litter COI ${(ranked[0]!.litterCoi * 100).toFixed(2)} %, highest ${(ranked.at(-1)!.litterCoi * 100).toFixed(2)} %`);
console.log(`  ${ranked[0]!.explanation}`);
