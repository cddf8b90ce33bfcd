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
  return { rows: shuffled(random, rows), inOrder: rows, offered, doe, rounds: round, farmOf: farmOfAnimal(rows, farms) };
}

/** The farm (index) each animal belongs to: a kit its dam's, a bought-in animal the farm it joined (by position). */
function farmOfAnimal(rows: BreedAnimal[], farms: { does: string[]; bucks: string[] }[]): Map<string, number> {
  const out = new Map<string, number>();
  farms.forEach((farm, f) => [...farm.does, ...farm.bucks].forEach((id) => out.set(id, f)));
  for (const row of rows) {
    if (out.has(row.id)) continue;
    out.set(row.id, row.damId ? (out.get(row.damId) ?? 0) : out.size % FARMS);
  }
  return out;
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

// ---------------------------------------------------------------------------------------------------------
// The whole request against PostgreSQL (when DATABASE_URL names a throwaway cluster, e.g. after
// `source .data/<name>.env`): the same pedigree written as a co-op of 50 farms, the 200 bucks offered, and
// the finder service timed from the doe's farm — offers, cards, get's records and places read, ranked, presented.
if (process.env.DATABASE_URL) {
  const { randomUUID } = await import('node:crypto');
  const { connectDatabase, closeDatabase } = await import('../../packages/server/src/composition/database');
  const { withTenant } = await import('../../packages/server/src/db/tenant');
  const { createCooperative } = await import('../../packages/server/src/modules/coops/coops.service');
  const { createFarm } = await import('../../packages/server/src/modules/farms/farms.service');
  const { createUser } = await import('../../packages/server/src/modules/users/users.service');
  const { rows: sql } = await import('../../packages/server/src/modules/stud-share/stud-share-queries');
  const { findStuds } = await import('../../packages/server/src/modules/stud-share/stud-finder.service');
  const { studFinderQuerySchema } = await import('@burrowline/shared');
  connectDatabase(process.env.DATABASE_URL);
  try {
    const setupStart = performance.now();
    const slug = `bench-stud-${randomUUID().slice(0, 8)}`;
    const uuidOf = new Map(coop.inOrder.map((row) => [row.id, randomUUID()]));
    const sires = new Set(coop.inOrder.map((row) => row.sireId).filter(Boolean));
    const { coopId, farmIds, asker } = await createCooperative({ name: `Bench ${slug}`, slug }, async (created, tx) => {
      const ids: string[] = [];
      for (let f = 0; f <= FARMS; f++) {
        const farm = await createFarm(created.id, { name: `Bench farm ${f}`, location: 'Bench County', timeZone: 'America/Chicago', weightUnit: 'kg_g', temperatureUnit: 'C', breedsKept: [], description: '' }, tx);
        ids.push(farm.id);
      }
      const user = await createUser({ coopId: created.id, farmId: ids[FARMS]!, email: `${slug}@example.test`, name: 'Bench member', role: 'member', passwordHash: null }, tx);
      return { coopId: created.id, farmIds: ids, asker: user };
    });
    // The doe moves to a farm of her own, so every offered buck is another farm's.
    const farmIndexOf = (id: string) => (id === coop.doe ? FARMS : coop.farmOf.get(id) ?? 0);
    const CHUNK = 5_000;
    for (let start = 0; start < coop.inOrder.length; start += CHUNK) {
      const chunk = coop.inOrder.slice(start, start + CHUNK);
      await withTenant({ coopId }, (tx) => sql(tx,
        `INSERT INTO animals (id, coop_id, owning_farm_id, keeping_farm_id, breeding_farm_id, tattoo, name, sex, birth_date, sire_id, dam_id, lifecycle, disposition)
         SELECT id, $1, farm, farm, farm, tattoo, '', sex, '2024-01-01', sire, dam, 'breeding', 'on_farm'
           FROM unnest($2::uuid[], $3::uuid[], $4::text[], $5::text[], $6::uuid[], $7::uuid[]) AS t(id, farm, tattoo, sex, sire, dam)`,
        [coopId, chunk.map((r) => uuidOf.get(r.id)), chunk.map((r) => farmIds[farmIndexOf(r.id)]), chunk.map((_, i) => `B${start + i}`),
          chunk.map((r) => (sires.has(r.id) || coop.offered.includes(r.id) ? 'buck' : 'doe')),
          chunk.map((r) => (r.sireId ? uuidOf.get(r.sireId) : null)), chunk.map((r) => (r.damId ? uuidOf.get(r.damId) : null))],
      ));
    }
    await withTenant({ coopId }, (tx) => sql(tx,
      `INSERT INTO stud_offers (coop_id, farm_id, buck_id, offers_loan, offers_service, loan_fee_cents, longest_loan_days, rest_days)
       SELECT $1, a.owning_farm_id, a.id, true, true, 3000, 42, 7 FROM animals a WHERE a.id = ANY($2::uuid[])`,
      [coopId, coop.offered.map((id) => uuidOf.get(id))],
    ));
    // What autovacuum would soon do: plans are made with the new rows' statistics (the owner may analyse).
    if (process.env.DATABASE_OWNER_URL) {
      const pg = (await import('pg')).default;
      const owner = new pg.Client({ connectionString: process.env.DATABASE_OWNER_URL });
      await owner.connect();
      await owner.query('ANALYZE animals; ANALYZE stud_offers; ANALYZE litters; ANALYZE weigh_ins');
      await owner.end();
    }
    const setupMs = performance.now() - setupStart;
    const actor = { id: asker.id, coopId, farmId: farmIds[FARMS]!, mentorId: null, email: asker.email, name: asker.name, role: 'member' as const };
    const query = studFinderQuerySchema.parse({ damId: uuidOf.get(coop.doe), pageSize: 25 });
    const coldStart = performance.now();
    const first = await findStuds(actor, query);
    const coldRequestMs = performance.now() - coldStart;
    const requestTimes: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      const start = performance.now();
      await findStuds(actor, query);
      requestTimes.push(performance.now() - start);
    }
    const [load] = (await import('node:os')).loadavg();
    console.log(`database: co-op of ${FARMS + 1} farms written in ${(setupMs / 1000).toFixed(1)} s; ${first.total} offered bucks found for the doe`);
    console.log(`the finder service, whole request (reads, ranking, presenting a page of 25): first ${coldRequestMs.toFixed(0)} ms (reads the co-op's pedigree into memory), then median of ${RUNS} ${median(requestTimes).toFixed(1)} ms (budget ${BUDGET_MS} ms; machine load average ${load!.toFixed(1)})`);
  } finally {
    await closeDatabase();
  }
}
