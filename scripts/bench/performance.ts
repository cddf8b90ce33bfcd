// Performance tables benchmark: a farm with 100 does, 10 bucks and five years of invented
// records — services (some missed), litters with losses and weanings (weighed), a grow-out group per
// litter with four weigh-ins, feed bought and given to the does and the groups, and a processing record
// per group — and the time to compute every performance table (per doe, per buck, per breed and cross,
// per group, the keep and cull suggestions):
//   1. in memory, with the shared function the server uses (median of warm runs), always;
//   2. through the real HTTP API of an app it starts itself, on a real PostgreSQL database, when
//      DATABASE_URL is set (a migrated, throwaway database: e.g. `source .data/<name>.env` after
//      `node scripts/test-infra.mjs <name> …`). Each run adds its own co-op ("Bench co-op …") and leaves
//      it there. It also counts the SQL statements of one request, which must not grow with the does.
// Run: `npm run bench performance` (BENCH_PERF_DOES=200, BENCH_PERF_YEARS=5, BENCH_PERF_RUNS=9, BENCH_PERF_HTTP_RUNS=5).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import {
  addDays, CSRF_HEADER, lastTwelveMonths, performanceTables, todayIn,
  type FeedOverviewDto, type LitterEvent, type PerformanceDto, type PerformanceInput, type ServiceOutcome,
} from '@burrowline/shared';
import { randomInt, seededRandom } from '../../packages/shared/src/pedigree/seeded-random';

const DOES = Number(process.env.BENCH_PERF_DOES ?? 100);
const BUCKS = Math.max(2, Math.round(DOES / 10));
const YEARS = Number(process.env.BENCH_PERF_YEARS ?? 5);
const RUNS = Number(process.env.BENCH_PERF_RUNS ?? 9);
const HTTP_RUNS = Number(process.env.BENCH_PERF_HTTP_RUNS ?? 5);
const BREEDS = ['New Zealand', 'Californian', 'Silver Fox', 'Champagne d\u2019Argent'];

interface Generated {
  animals: { id: string; name: string; tattoo: string; sex: 'doe' | 'buck'; breed: string; birthDate: string }[];
  services: { id: string; doeId: string; buckId: string; servicedOn: string; outcome: ServiceOutcome; palpatedOn: string | null; litterId: string | null }[];
  litters: { id: string; serviceId: string; damId: string; sireId: string; kindledOn: string; bornAlive: number; bornDead: number; events: (LitterEvent & { id: string; weaningWeightGrams?: number })[] }[];
  groups: { id: string; name: string; formedOn: string; closedOn: string; litterId: string; heads: number; targetGrams: number; weighIns: { weighedOn: string; totalGrams: number; headCount: number }[]; feedGrams: number }[];
  doeFeed: { litterId: string; doeId: string; givenOn: string; fromOn: string; grams: number }[];
  processing: { id: string; groupId: string; processedOn: string; headCount: number; liveGrams: number; hotCarcassGrams: number; chilledCarcassGrams: number; ageDays: number }[];
}

/** Five years of a 100-doe farm: about 24 litters a doe, one grow-out group per weaned litter. */
function generate(today: string): Generated {
  const random = seededRandom(20261201);
  const pick = <T>(xs: T[]) => xs[Math.floor(random() * xs.length)]!;
  const g: Generated = { animals: [], services: [], litters: [], groups: [], doeFeed: [], processing: [] };
  const start = addDays(today, -Math.round(YEARS * 365.25));
  const bucks = Array.from({ length: BUCKS }, (_, i) => ({ id: randomUUID(), name: `Buck ${i + 1}`, tattoo: `BB${i + 1}`, sex: 'buck' as const, breed: BREEDS[i % BREEDS.length]!, birthDate: addDays(start, -300) }));
  g.animals.push(...bucks);
  for (let d = 0; d < DOES; d++) {
    const doe = { id: randomUUID(), name: `Doe ${d + 1}`, tattoo: `BD${d + 1}`, sex: 'doe' as const, breed: pick(BREEDS), birthDate: addDays(start, -randomInt(random, 200, 400)) };
    g.animals.push(doe);
    let t = addDays(start, randomInt(random, 0, 60));
    while (t <= addDays(today, -90)) {
      const buck = pick(bucks);
      const serviceId = randomUUID();
      if (random() < 0.15) {
        g.services.push({ id: serviceId, doeId: doe.id, buckId: buck.id, servicedOn: t, outcome: 'missed', palpatedOn: addDays(t, 12), litterId: null });
        t = addDays(t, 14);
        continue;
      }
      const litterId = randomUUID();
      const kindledOn = addDays(t, randomInt(random, 30, 33));
      const bornAlive = randomInt(random, 4, 12);
      const lost = Math.min(bornAlive - 1, pick([0, 0, 1, 1, 2, 3]));
      const weaned = bornAlive - lost;
      const weanedOn = addDays(kindledOn, 35);
      const events: Generated['litters'][number]['events'] = [];
      if (lost > 0) events.push({ id: randomUUID(), kind: 'lost', on: addDays(kindledOn, 2), count: lost, cause: 'Chilled' });
      const weaningGrams = weaned * randomInt(random, 650, 900);
      events.push({ id: randomUUID(), kind: 'weaned', on: weanedOn, count: weaned, weaningWeightGrams: weaningGrams });
      g.services.push({ id: serviceId, doeId: doe.id, buckId: buck.id, servicedOn: t, outcome: 'kindled', palpatedOn: null, litterId });
      g.litters.push({ id: litterId, serviceId, damId: doe.id, sireId: buck.id, kindledOn, bornAlive, bornDead: randomInt(random, 0, 2), events });
      g.doeFeed.push({ litterId, doeId: doe.id, givenOn: addDays(kindledOn, 30), fromOn: kindledOn, grams: randomInt(random, 15_000, 25_000) });
      // The weaned kits grow out together: weighed at 35, 49, 63 and 77 days, processed at 78.
      const groupId = randomUUID();
      const gain = randomInt(random, 36, 48);
      const perHead = (age: number) => Math.round(weaningGrams / weaned + gain * (age - 35));
      const weighIns = [35, 49, 63, 77].map((age) => ({ weighedOn: addDays(kindledOn, age), totalGrams: perHead(age) * weaned, headCount: weaned }));
      const live = perHead(78) * weaned;
      const hot = Math.round(live * (0.53 + random() * 0.05));
      const feedGrams = Math.round((live - weighIns[0]!.totalGrams) * (3.4 + random() * 0.8));
      g.groups.push({ id: groupId, name: `Group ${g.groups.length + 1}`, formedOn: weanedOn, closedOn: addDays(kindledOn, 78), litterId, heads: weaned, targetGrams: 2270, weighIns, feedGrams });
      g.processing.push({ id: randomUUID(), groupId, processedOn: addDays(kindledOn, 78), headCount: weaned, liveGrams: live, hotCarcassGrams: hot, chilledCarcassGrams: Math.round(hot * 0.98), ageDays: 78 });
      t = addDays(kindledOn, 42);
    }
  }
  return g;
}

/** The records as the server hands them to performanceTables (what the services return). */
function inputOf(g: Generated, today: string, all: boolean): PerformanceInput {
  const litterById = new Map(g.litters.map((l) => [l.id, l]));
  return {
    today,
    period: all ? null : lastTwelveMonths(today),
    animals: g.animals.map((a) => ({ id: a.id, name: a.name, tattoo: a.tattoo, sex: a.sex, breedName: a.breed, onFarm: true })),
    services: g.services.map((s) => ({ doeId: s.doeId, buckId: s.buckId, servicedOn: s.servicedOn, outcome: s.outcome })),
    litters: g.litters.map((l) => ({
      id: l.id, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn,
      record: { id: l.id, kindledOn: l.kindledOn, bornAlive: l.bornAlive, bornDead: l.bornDead, events: l.events },
      weaningWeightGrams: l.events.find((e) => e.kind === 'weaned')?.weaningWeightGrams ?? null,
    })),
    groups: g.groups.map((x) => ({
      id: x.id, name: x.name, formedOn: x.formedOn, status: 'closed' as const, closedOn: x.closedOn, targetGrams: x.targetGrams,
      litters: [{ litterId: x.litterId, heads: x.heads, kindledOn: litterById.get(x.litterId)!.kindledOn }],
      weighIns: x.weighIns, feedGrams: x.feedGrams, feedCostCents: Math.round(x.feedGrams * 0.1),
    })),
    doeLitterFeed: new Map(g.doeFeed.map((f) => [f.litterId, { grams: f.grams, costCents: Math.round(f.grams * 0.1) }])),
    processing: g.processing.map((p) => ({ id: p.id, processedOn: p.processedOn, animalId: null, groupId: p.groupId, headCount: p.headCount, liveGrams: p.liveGrams, hotCarcassGrams: p.hotCarcassGrams })),
  };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const ms = (x: number) => `${x.toFixed(1)} ms`;

function timeInMemory(g: Generated, today: string) {
  for (const all of [true, false]) {
    const input = inputOf(g, today, all);
    for (let i = 0; i < 2; i++) performanceTables(input); // warm-up
    const times: number[] = [];
    let tables = performanceTables(input);
    for (let i = 0; i < RUNS; i++) {
      const t0 = performance.now();
      tables = performanceTables(input);
      times.push(performance.now() - t0);
    }
    console.log(
      `  in memory, ${all ? 'all records' : 'last 12 months'}: median ${ms(median(times))} (min ${ms(Math.min(...times))}, max ${ms(Math.max(...times))}, ${RUNS} warm runs)`
      + ` → ${tables.does.length} does, ${tables.bucks.length} bucks, ${tables.breeds.length} breeds/crosses, ${tables.groups.length} groups, ${tables.suggestions.length} suggestions`,
    );
  }
}

const today = todayIn('America/Chicago');
const generated = generate(today);
const weighIns = generated.groups.reduce((n, x) => n + x.weighIns.length, 0);
console.log(
  `performance tables: ${DOES} does, ${BUCKS} bucks, ${YEARS} years → ${generated.services.length.toLocaleString('en-US')} services, `
  + `${generated.litters.length.toLocaleString('en-US')} litters, ${generated.groups.length.toLocaleString('en-US')} groups with ${weighIns.toLocaleString('en-US')} weigh-ins, `
  + `${(generated.doeFeed.length + generated.groups.length).toLocaleString('en-US')} feed entries, ${generated.processing.length.toLocaleString('en-US')} processing records`,
);
timeInMemory(generated, today);

if (!process.env.DATABASE_URL) {
  console.log('  HTTP on PostgreSQL: skipped — set DATABASE_URL to a migrated, throwaway database (e.g. `source .data/<name>.env`) to run it');
  process.exit(0);
}

process.env.SESSION_SECRET ??= `bench-${randomUUID()}-${randomUUID()}`;
process.env.LOG_LEVEL ??= 'warn';
const { createApp } = await import('../../packages/server/src/app');
const { withTenant } = await import('../../packages/server/src/db/tenant');
const { closeDatabase, connectDatabase, database } = await import('../../packages/server/src/composition/database');
const { hashPassword } = await import('../../packages/server/src/lib/passwords');
const { createCooperative } = await import('../../packages/server/src/modules/coops/coops.service');
const { createFarm } = await import('../../packages/server/src/modules/farms/farms.service');
const { createUser } = await import('../../packages/server/src/modules/users/users.service');
const { breedsOf } = await import('../../packages/server/src/modules/breeds/breeds.service');
const { importHerd } = await import('../../packages/server/src/modules/animals/herd-import.service');
const { importServices } = await import('../../packages/server/src/modules/almanac/almanac-import.service');
const { importLitters } = await import('../../packages/server/src/modules/litters/litters-import.service');
const { refreshFeedBook } = await import('../../packages/server/src/modules/feed/feed-totals.service');
const { feedKeyOf } = await import('@burrowline/shared');

connectDatabase(process.env.DATABASE_URL);
const password = `bench-${randomUUID()}`;
const passwordHash = await hashPassword(password);
const tag = randomUUID().slice(0, 8);
const email = `bench-perf-${tag}@example.test`;

/** Loads the generated farm: animals, services and litters through their import services (checked), the rest in bulk. */
async function loadFarm(): Promise<{ coopId: string; farmId: string }> {
  let loaded = { coopId: '', farmId: '' };
  await createCooperative({ name: `Bench co-op ${tag}`, slug: `bench-perf-${tag}` }, async (coop, tx) => {
    const farm = await createFarm(coop.id, { name: 'Bench Farm', location: 'Tamsin County', timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '' }, tx);
    const user = await createUser({ coopId: coop.id, farmId: farm.id, email, name: 'Bench Member', role: 'member', passwordHash }, tx);
    loaded = { coopId: coop.id, farmId: farm.id };
    const breedIds = new Map((await breedsOf(coop.id, tx)).map((b) => [b.name, b.id]));
    await importHerd(coop.id, generated.animals.map((a) => ({
      id: a.id, farmId: farm.id, breedingFarmId: null, tattoo: a.tattoo, name: a.name, sex: a.sex, breedId: breedIds.get(a.breed) ?? null,
      birthDate: a.birthDate, sireId: null, damId: null, lifecycle: 'breeding', arrivedOn: a.birthDate,
    })), user.id, tx, { recompute: false });
    const kindledOn = new Map(generated.litters.map((l) => [l.serviceId, l.kindledOn]));
    await importServices(
      tx, coop.id, today,
      generated.services.map((s) => ({
        id: s.id, farmId: farm.id, doeId: s.doeId, buckId: s.buckId, servicedOn: s.servicedOn, status: s.outcome === 'missed' ? 'empty' as const : 'kindled' as const,
        closedOn: s.palpatedOn ?? kindledOn.get(s.id)!, closeReason: s.palpatedOn ? 'Palpated empty' : null, recordedBy: user.id,
      })),
      generated.services.filter((s) => s.palpatedOn).map((s) => ({ serviceId: s.id, palpatedOn: s.palpatedOn!, result: 'negative' as const, recordedBy: user.id })),
    );
    const servicedOn = new Map(generated.services.map((s) => [s.id, s.servicedOn]));
    await importLitters(
      tx, coop.id, today,
      generated.litters.map((l) => ({ id: l.id, farmId: farm.id, serviceId: l.serviceId, servicedOn: servicedOn.get(l.serviceId)!, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn, bornAlive: l.bornAlive, bornDead: l.bornDead, recordedBy: user.id })),
      generated.litters.flatMap((l) => l.events.map((e) => ({
        id: e.id, litterId: l.id, kind: e.kind, on: e.on, count: e.count, cause: e.kind === 'lost' ? e.cause : null, enteredBy: user.id, weaningWeightGrams: e.weaningWeightGrams ?? null,
      }))),
    );
    const q = (sql: string, bind: unknown[]) => database().query(sql, { bind, transaction: tx });
    const c = coop.id;
    const f = farm.id;
    // One purchase a year of pellets, large enough for everything given that year (0.1 cent a gram).
    const years = Math.ceil(YEARS) + 1;
    const purchaseIds = Array.from({ length: years }, () => randomUUID());
    const product = 'Grower pellets 16 %';
    for (let y = 0; y < years; y++) {
      await q(
        `INSERT INTO feed_purchases (id, coop_id, farm_id, bought_on, product_name, bag_grams, bags, price_cents, crude_protein_percent, entered_by) VALUES ($1,$2,$3,$4,$5,25000,1000,2500000,16,$6)`,
        [purchaseIds[y], c, f, addDays(today, -Math.round((YEARS + 0.3 - y) * 365.25)), product, user.id],
      );
    }
    const rows = <T>(xs: T[], size = 500) => Array.from({ length: Math.ceil(xs.length / size) }, (_, i) => xs.slice(i * size, (i + 1) * size));
    for (const chunk of rows(generated.groups)) {
      await q(
        `INSERT INTO grow_out_groups (id, coop_id, farm_id, name, formed_on, target_grams, status, closed_on, created_by)
         SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::text[], $5::date[], $6::int[], $7::text[], $8::date[], $9::uuid[])`,
        [chunk.map((x) => x.id), chunk.map(() => c), chunk.map(() => f), chunk.map((x) => x.name), chunk.map((x) => x.formedOn), chunk.map((x) => x.targetGrams), chunk.map(() => 'closed'), chunk.map((x) => x.closedOn), chunk.map(() => user.id)],
      );
      await q(
        `INSERT INTO grow_out_group_litters (coop_id, group_id, litter_id, heads) SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::int[])`,
        [chunk.map(() => c), chunk.map((x) => x.id), chunk.map((x) => x.litterId), chunk.map((x) => x.heads)],
      );
      const w = chunk.flatMap((x) => x.weighIns.map((wi) => ({ groupId: x.id, ...wi })));
      await q(
        `INSERT INTO weigh_ins (coop_id, farm_id, group_id, total_grams, head_count, weighed_on, entered_by)
         SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::int[], $5::int[], $6::date[], $7::uuid[])`,
        [w.map(() => c), w.map(() => f), w.map((x) => x.groupId), w.map((x) => x.totalGrams), w.map((x) => x.headCount), w.map((x) => x.weighedOn), w.map(() => user.id)],
      );
      const p = generated.processing.filter((r) => chunk.some((x) => x.id === r.groupId));
      await q(
        `INSERT INTO processing_records (id, coop_id, farm_id, processed_on, group_id, head_count, age_days, live_grams, hot_carcass_grams, chilled_carcass_grams, hot_dress_out_percent, chilled_dress_out_percent, usda_class, recorded_by)
         SELECT *, 'fryer', $13::uuid FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::date[], $5::uuid[], $6::int[], $7::int[], $8::int[], $9::int[], $10::int[], $11::numeric[], $12::numeric[])`,
        [p.map((r) => r.id), p.map(() => c), p.map(() => f), p.map((r) => r.processedOn), p.map((r) => r.groupId), p.map((r) => r.headCount), p.map((r) => r.ageDays), p.map((r) => r.liveGrams),
          p.map((r) => r.hotCarcassGrams), p.map((r) => r.chilledCarcassGrams), p.map((r) => (r.hotCarcassGrams / r.liveGrams) * 100), p.map((r) => (r.chilledCarcassGrams / r.liveGrams) * 100), user.id],
      );
    }
    // Feed given: to each doe while nursing (charged to her litter), to each group over its grow-out.
    const uses = [
      ...generated.doeFeed.map((x) => ({ id: randomUUID(), givenOn: x.givenOn, fromOn: x.fromOn, grams: x.grams, target: 'doe', groupId: null as string | null, doeId: x.doeId as string | null, litterId: x.litterId as string | null })),
      ...generated.groups.map((x) => ({ id: randomUUID(), givenOn: x.weighIns.at(-1)!.weighedOn, fromOn: x.formedOn, grams: x.feedGrams, target: 'group', groupId: x.id as string | null, doeId: null as string | null, litterId: null as string | null })),
    ].sort((a, b) => a.givenOn.localeCompare(b.givenOn));
    const purchaseFor = (date: string) => purchaseIds[Math.min(years - 1, Math.max(0, Math.floor((Math.round((YEARS + 0.3) * 365.25) - (Date.parse(today) - Date.parse(date)) / 86_400_000) / 365.25)))]!;
    for (const chunk of rows(uses)) {
      await q(
        `INSERT INTO feed_uses (id, coop_id, farm_id, given_on, from_on, grams, feed_key, purchase_id, target, group_id, doe_id, entered_by)
         SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::date[], $5::date[], $6::int[], $7::text[], $8::uuid[], $9::text[], $10::uuid[], $11::uuid[], $12::uuid[])`,
        [chunk.map((u) => u.id), chunk.map(() => c), chunk.map(() => f), chunk.map((u) => u.givenOn), chunk.map((u) => u.fromOn), chunk.map((u) => u.grams), chunk.map(() => feedKeyOf(product)),
          chunk.map((u) => purchaseFor(u.givenOn)), chunk.map((u) => u.target), chunk.map((u) => u.groupId), chunk.map((u) => u.doeId), chunk.map(() => user.id)],
      );
      await q(
        `INSERT INTO feed_use_shares (coop_id, feed_use_id, group_id, litter_id, grams) SELECT * FROM unnest($1::uuid[], $2::uuid[], $3::uuid[], $4::uuid[], $5::int[])`,
        [chunk.map(() => c), chunk.map((u) => u.id), chunk.map((u) => u.groupId), chunk.map((u) => u.litterId), chunk.map((u) => u.grams)],
      );
    }
    // Rows loaded in bulk: the book's stored figures worked out once, as every change through the service does.
    await refreshFeedBook(tx, c, f);
  });
  return loaded;
}

const t0 = performance.now();
const { coopId, farmId } = await loadFarm();
console.log(`  loaded into PostgreSQL in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
// Statistics as a farm that grew over five years has them (autovacuum would catch up within a minute; the
// app role owns no table, so this needs the owner's URL). Without, a co-op just loaded among hundreds of
// test co-ops looks like a handful of rows to the planner.
if (process.env.DATABASE_OWNER_URL) {
  const pg = (await import('pg')).default;
  const owner = new pg.Client(process.env.DATABASE_OWNER_URL);
  await owner.connect();
  await owner.query('ANALYZE');
  await owner.end();
  console.log('  analyzed (as the owner)');
}

const server = http.createServer();
await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const handle = createApp({ appUrl: url });
server.on('request', handle.app);
try {
  const signIn = await fetch(`${url}/api/session`, { method: 'POST', headers: { 'content-type': 'application/json', [CSRF_HEADER]: '1' }, body: JSON.stringify({ email, password }) });
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
  const cookie = signIn.headers.getSetCookie().map((x) => x.split(';')[0]).join('; ');
  // Counted on the driver, so statements sent past Sequelize (prepared reads) count too.
  let statements = 0;
  const pg = (await import('pg')).default;
  const sendQuery = pg.Client.prototype.query;
  pg.Client.prototype.query = function countedQuery(this: unknown, ...args: unknown[]) {
    statements++;
    return (sendQuery as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof pg.Client.prototype.query;
  // Changes to the farm's records (through the app's role, as any write), each moving a figure the tables
  // read, so the next read works them out again: a group's weigh-in corrected by a gram (one source changed:
  // the server re-reads everything and unpacks again only what differs), or every source at once (a
  // service's closing day, a litter's born dead, a weigh-in, a feed share's cost, a processing record).
  let flip = 1;
  const change = (everySource: boolean) => {
    flip = -flip;
    return withTenant({ coopId }, async (tx) => {
      const q = (sql: string) => database().query(sql, { bind: [coopId, farmId, flip], transaction: tx });
      await q(`UPDATE weigh_ins SET total_grams = total_grams + $3 WHERE id = (SELECT id FROM weigh_ins WHERE coop_id = $1 AND farm_id = $2 AND group_id IS NOT NULL ORDER BY weighed_on DESC LIMIT 1)`);
      if (!everySource) return;
      await q(`UPDATE services SET closed_on = closed_on + $3::int WHERE id = (SELECT id FROM services WHERE coop_id = $1 AND farm_id = $2 AND status = 'empty' ORDER BY serviced_on LIMIT 1)`);
      await q(`UPDATE litters SET born_dead = born_dead + (CASE WHEN $3::int > 0 THEN 1 ELSE -1 END) WHERE id = (SELECT id FROM litters WHERE coop_id = $1 AND farm_id = $2 AND born_dead > 0 ORDER BY kindled_on LIMIT 1)`);
      await q(`UPDATE feed_use_shares SET cost_cents = coalesce(cost_cents, 1) + $3 WHERE id = (SELECT sh.id FROM feed_use_shares sh JOIN feed_uses u ON u.id = sh.feed_use_id WHERE u.coop_id = $1 AND u.farm_id = $2 ORDER BY u.given_on LIMIT 1)`);
      await q(`UPDATE processing_records SET live_grams = live_grams + $3 WHERE id = (SELECT id FROM processing_records WHERE coop_id = $1 AND farm_id = $2 ORDER BY processed_on LIMIT 1)`);
    });
  };
  for (const period of ['all', 'last_12_months'] as const) {
    const get = async () => {
      const res = await fetch(`${url}/api/performance?period=${period}`, { headers: { cookie } });
      if (!res.ok) throw new Error(`GET /api/performance failed: ${res.status} ${(await res.text()).slice(0, 300)}`);
      return (await res.json()) as PerformanceDto;
    };
    await get();
    await get(); // warm
    let body: PerformanceDto | null = null;
    let perRequest = 0;
    const cases = [
      ['after a weigh-in was corrected (worked out again)', () => change(false)],
      ['after every source changed (worked out again)', () => change(true)],
      ['nothing changed (kept)', null],
    ] as const;
    for (const [label, before] of cases) {
      const times: number[] = [];
      for (let i = 0; i < HTTP_RUNS; i++) {
        if (before) await before();
        const counted = statements;
        const t = performance.now();
        body = await get();
        times.push(performance.now() - t);
        perRequest = statements - counted;
      }
      console.log(
        `  HTTP GET /api/performance?period=${period} on PostgreSQL, ${label}: `
        + `median ${ms(median(times))} (min ${ms(Math.min(...times))}, max ${ms(Math.max(...times))}, ${HTTP_RUNS} warm runs), `
        + `${perRequest} SQL statements a request (session included) → ${body!.does.length} does, ${body!.groups.length} groups, missing: ${body!.missing.length === 0 ? 'none' : body!.missing.join(', ')}`,
      );
    }
  }
  // Where a request's time goes: each source the service reads, once, inside one tenant transaction.
  const { serviceOutcomesOfFarm } = await import('../../packages/server/src/modules/almanac/breeding.service');
  const { litterFactsOfFarm } = await import('../../packages/server/src/modules/litters/litters.service');
  const { growOutFactsOfFarm } = await import('../../packages/server/src/modules/grow-out/grow-out-facts.service');
  const { doeLitterFeedOfFarm } = await import('../../packages/server/src/modules/feed/feed.service');
  const { processingFactsOfFarm } = await import('../../packages/server/src/modules/processing/processing.service');
  const parts: string[] = [];
  await withTenant({ coopId }, async (tx) => {
    const time = async (label: string, read: () => Promise<unknown>) => {
      const t = performance.now();
      await read();
      parts.push(`${label} ${ms(performance.now() - t)}`);
    };
    await time('services', () => serviceOutcomesOfFarm(tx, coopId, farmId, today));
    await time('litters', () => litterFactsOfFarm(tx, coopId, farmId));
    await time('grow-out groups', () => growOutFactsOfFarm(tx, coopId, farmId));
    await time('doe + litter feed', () => doeLitterFeedOfFarm(tx, coopId, farmId));
    await time('processing', () => processingFactsOfFarm(tx, coopId, farmId));
  });
  console.log(`  of which reading the sources (once each): ${parts.join(', ')}`);

  // The feed book: reading it, and correcting a purchase's price (every use of that feed is costed anew and
  // the whole book checked before the answer).
  const feedTimes: number[] = [];
  const correctTimes: number[] = [];
  let book: FeedOverviewDto | null = null;
  for (let i = 0; i < HTTP_RUNS + 1; i++) {
    let t = performance.now();
    const res = await fetch(`${url}/api/feed`, { headers: { cookie } });
    if (!res.ok) throw new Error(`GET /api/feed failed: ${res.status}`);
    book = (await res.json()) as FeedOverviewDto;
    if (i > 0) feedTimes.push(performance.now() - t);
    const p = book.purchases.at(-1)!;
    t = performance.now();
    const put = await fetch(`${url}/api/feed/purchases/${p.id}`, {
      method: 'PUT', headers: { cookie, 'content-type': 'application/json', [CSRF_HEADER]: '1' },
      body: JSON.stringify({ boughtOn: p.boughtOn, productName: p.productName, bagGrams: p.bagGrams, bags: p.bags, priceCents: p.priceCents! + 1, crudeProteinPercent: p.crudeProteinPercent, note: p.note, version: p.version }),
    });
    if (!put.ok) throw new Error(`PUT /api/feed/purchases failed: ${put.status} ${(await put.text()).slice(0, 300)}`);
    if (i > 0) correctTimes.push(performance.now() - t);
  }
  console.log(
    `  HTTP GET /api/feed (${book!.purchases.length} purchases, ${book!.uses.length} entries of feed given): median ${ms(median(feedTimes))}; `
    + `PUT a purchase's price correction: median ${ms(median(correctTimes))} (${HTTP_RUNS} warm runs each)`,
  );
} finally {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await handle.close();
  await closeDatabase().catch(() => undefined);
}
