// Builds the benchmark co-op (invented data): farms that breed their does every round for a few
// years, mostly to their own bucks and about a quarter of the time to another farm's, keep some kits as
// the next breeders (so the pedigree runs about eight generations deep), sell or process the rest, weigh
// kits every two weeks while they grow, and record every service, palpation, litter and the Almanac's
// tasks planned with the shared planning rules. Animals go in through the herd import service (its
// checks, histories and the pedigree figures computed by the product); the other records in bulk
// (INSERT … unnest) inside the co-op's tenant transaction, so every constraint and row-level policy applies.
import { randomUUID } from 'node:crypto';
import {
  addDays, daysBetween, defaultCycleSettings, planAfterPalpation, planFromKindling, planFromService, settleServiceTasksOnKindling,
  todayIn, type PlannedTask, type TaskRecord,
} from '@burrowline/shared';
import { pick, randomInt, seededRandom } from '../../../packages/shared/src/pedigree/seeded-random';

export interface BuiltCoop {
  coopId: string;
  slug: string;
  email: string;
  password: string;
  farmId: string;
  /** A breeding doe of the signed-in farm and bucks of several farms, for the comparison. */
  doeId: string;
  buckIds: string[];
  counts: Record<string, number>;
  builtInSeconds: number;
}

const FARMS = 50;
const ROUND_DAYS = 45;
const ROUNDS_TO_MATURITY = 4; // kept kits are bred from about six months old
const KEEP_KIT = 0.1;
const OTHER_FARM_BUCK = 0.25;
const KINDLE_RATE = 0.8;
const KEPT_ON_FARM_DAYS = 400; // recorded kits not kept as breeders stay about a year, then are sold or processed
const GROWTH_WEIGHED_DAYS = 150;
const WEIGH_EVERY_DAYS = 14;
const BREEDS = ['New Zealand', 'Californian', 'Silver Fox', 'Champagne d\u2019Argent'];

interface Kit {
  id: string;
  sex: 'buck' | 'doe';
  farm: number;
  birthDate: string;
}

export async function buildCoop(opts: { animals: number; slug: string; password: string }): Promise<BuiltCoop> {
  const started = Date.now();
  const { database } = await import('../../../packages/server/src/composition/database');
  const { hashPassword } = await import('../../../packages/server/src/lib/passwords');
  const { createCooperative } = await import('../../../packages/server/src/modules/coops/coops.service');
  const { createFarm } = await import('../../../packages/server/src/modules/farms/farms.service');
  const { createUser } = await import('../../../packages/server/src/modules/users/users.service');
  const { breedsOf } = await import('../../../packages/server/src/modules/breeds/breeds.service');
  const { importHerd } = await import('../../../packages/server/src/modules/animals/herd-import.service');
  const { insertMany } = await import('../../../packages/server/src/db/bulk-insert');
  type ImportedAnimal = Parameters<typeof importHerd>[1][number];

  const random = seededRandom(20261204);
  const today = todayIn('America/Chicago');
  const settings = defaultCycleSettings();
  // Enough rounds for the wanted number of animals at about 2.4 recorded kits a litter.
  const doesPerFarm = Math.max(8, Math.round(opts.animals / (FARMS * 26 * KINDLE_RATE * 2.4)));
  const bucksPerFarm = Math.max(2, Math.round(doesPerFarm / 7));
  const rounds = Math.round(opts.animals / (FARMS * doesPerFarm * KINDLE_RATE * 2.4));
  const start = addDays(today, -rounds * ROUND_DAYS - 60);
  const passwordHash = await hashPassword(opts.password);
  const email = `member-1@${opts.slug}.example.test`;
  let built!: BuiltCoop;

  await createCooperative({ name: `Bench co-op ${opts.slug}`, slug: opts.slug }, async (coop, tx) => {
    const farms: string[] = [];
    const users: string[] = [];
    for (let f = 0; f < FARMS; f++) {
      const farm = await createFarm(coop.id, {
        name: `Bench Farm ${f + 1}`, location: `Tamsin County, lot ${f + 1}`, timeZone: 'America/Chicago', weightUnit: 'lb_oz', temperatureUnit: 'F', breedsKept: [], description: '',
      }, tx);
      const user = await createUser({ coopId: coop.id, farmId: farm.id, email: `member-${f + 1}@${opts.slug}.example.test`, name: `Bench Member ${f + 1}`, role: 'member', passwordHash }, tx);
      farms.push(farm.id);
      users.push(user.id);
    }
    const breedIds = new Map((await breedsOf(coop.id, tx)).map((b) => [b.name, b.id]));
    const breedOf = (f: number) => breedIds.get(BREEDS[f % BREEDS.length]!) ?? null;

    const animals: ImportedAnimal[] = [];
    const byId = new Map<string, ImportedAnimal>();
    const tattooSeq = new Array<number>(FARMS).fill(0);
    const add = (a: ImportedAnimal) => {
      animals.push(a);
      byId.set(a.id, a);
      return a;
    };
    // Parents named on the papers of the starting stock: outside animals of the co-op registry.
    const paper = (sex: 'buck' | 'doe', i: number) =>
      add({ id: randomUUID(), farmId: null, breedingFarmId: null, breederName: 'Outside breeder', tattoo: null, name: `Papers ${sex} ${i + 1}`, sex, breedId: breedOf(i), birthDate: addDays(start, -900), sireId: null, damId: null });
    const paperSires = Array.from({ length: 20 }, (_, i) => paper('buck', i));
    const paperDams = Array.from({ length: 40 }, (_, i) => paper('doe', i));
    const foundation = (f: number, sex: 'buck' | 'doe') => {
      const withPapers = random() < 0.4;
      const n = ++tattooSeq[f]!;
      return add({
        id: randomUUID(), farmId: farms[f]!, breedingFarmId: null, breederName: 'Outside breeder', tattoo: `F${f + 1}-${n}`, name: `${sex === 'doe' ? 'Doe' : 'Buck'} ${f + 1}.${n}`, sex,
        breedId: breedOf(f), birthDate: addDays(start, -randomInt(random, 200, 400)), sireId: withPapers ? pick(random, paperSires).id : null,
        damId: withPapers ? pick(random, paperDams).id : null, lifecycle: 'breeding', arrivedOn: addDays(start, -randomInt(random, 10, 60)),
      });
    };
    const does: string[][] = farms.map((_, f) => Array.from({ length: doesPerFarm }, () => foundation(f, 'doe').id));
    const bucks: string[][] = farms.map((_, f) => Array.from({ length: bucksPerFarm }, () => foundation(f, 'buck').id));
    const growing: { kit: Kit; readyRound: number }[][] = farms.map(() => []);

    const services: Record<string, unknown>[] = [];
    const palpations: Record<string, unknown>[] = [];
    const litters: Record<string, unknown>[] = [];
    const events: Record<string, unknown>[] = [];
    const kindledServices: { id: string; litterId: string; kindledOn: string }[] = [];
    const tasks: Record<string, unknown>[] = [];
    const serviceDates = new Map<string, string[]>();
    const pendingTasks: (() => void)[] = [];

    const retire = (id: string, on: string) => {
      const a = byId.get(id)!;
      Object.assign(a, { disposition: 'culled', dispositionCause: 'Replaced by a younger breeder', dispositionOn: on });
    };
    for (let round = 0; round < rounds; round++) {
      const day = addDays(start, round * ROUND_DAYS);
      for (let f = 0; f < FARMS; f++) {
        // Kits kept from earlier rounds replace a breeder of their sex.
        growing[f] = growing[f]!.filter(({ kit, readyRound }) => {
          if (readyRound > round) return true;
          const list = kit.sex === 'doe' ? does[f]! : bucks[f]!;
          const slot = Math.floor(random() * list.length);
          retire(list[slot]!, day);
          list[slot] = kit.id;
          Object.assign(byId.get(kit.id)!, { lifecycle: 'breeding', disposition: 'on_farm', dispositionCause: null, dispositionOn: undefined });
          return false;
        });
        for (const doeId of does[f]!) {
          const otherFarm = random() < OTHER_FARM_BUCK;
          const buckFarm = otherFarm ? (f + 1 + Math.floor(random() * (FARMS - 1))) % FARMS : f;
          const buckId = pick(random, bucks[buckFarm]!);
          const servicedOn = addDays(day, randomInt(random, 0, 6));
          if (servicedOn > today) continue;
          const keeper = users[f]!;
          const id = randomUUID();
          serviceDates.set(doeId, [...(serviceDates.get(doeId) ?? []), servicedOn]);
          const palpatedOn = addDays(servicedOn, settings.palpationDays);
          const kindles = random() < KINDLE_RATE;
          const kindledOn = addDays(servicedOn, pick(random, [30, 31, 31, 31, 32]));
          if (kindles && kindledOn <= today) {
            const litterId = randomUUID();
            // Stored closed until its litter exists, then linked (the two refer to each other).
            services.push({ id, coopId: coop.id, farmId: farms[f], doeId, buckId, servicedOn, status: 'missed', closedOn: kindledOn, closeReason: 'Linked to its litter below', recordedBy: keeper });
            palpations.push({ coopId: coop.id, farmId: farms[f], serviceId: id, palpatedOn, result: 'positive', recordedBy: keeper });
            kindledServices.push({ id, litterId, kindledOn });
            const bornAlive = pick(random, [5, 6, 7, 7, 8, 8, 8, 9, 9, 10, 11]);
            const lost = pick(random, [0, 0, 0, 1, 1, 2]);
            litters.push({ id: litterId, coopId: coop.id, farmId: farms[f], serviceId: id, damId: doeId, sireId: buckId, kindledOn, bornAlive, bornDead: pick(random, [0, 0, 0, 1, 1, 2]), recordedBy: keeper });
            if (lost > 0 && addDays(kindledOn, 2) <= today) {
              events.push({ id: randomUUID(), coopId: coop.id, farmId: farms[f], litterId, kind: 'lost', occurredOn: addDays(kindledOn, 2), kitCount: lost, cause: 'Chilled outside the nest', enteredBy: keeper, reviewState: 'accepted' });
            }
            const weanedOn = addDays(kindledOn, settings.weaningDays);
            const weaned = weanedOn <= today;
            if (weaned) {
              const kits = bornAlive - lost;
              events.push({
                id: randomUUID(), coopId: coop.id, farmId: farms[f], litterId, kind: 'weaned', occurredOn: weanedOn, kitCount: kits, enteredBy: keeper, reviewState: 'accepted',
                weaningWeightGrams: Math.round(kits * settings.weaningDays * (22 + randomInt(random, 0, 5))),
              });
            }
            // About 2–3 kits a litter get a record (the ones a breeder tattoos: kept, sold as stock, shown).
            const recorded = Math.min(bornAlive - lost, randomInt(random, 1, 4));
            for (let k = 0; k < recorded; k++) {
              const sex: 'buck' | 'doe' = random() < 0.45 ? 'buck' : 'doe';
              const n = ++tattooSeq[f]!;
              const kitId = randomUUID();
              const gone = daysBetween(kindledOn, today) > KEPT_ON_FARM_DAYS;
              const leftOn = addDays(kindledOn, KEPT_ON_FARM_DAYS - randomInt(random, 0, 30));
              add({
                id: kitId, farmId: farms[f]!, breedingFarmId: farms[f]!, tattoo: `F${f + 1}-${n}`, name: random() < 0.3 ? `Kit ${f + 1}.${n}` : '', sex, breedId: null,
                birthDate: kindledOn, sireId: buckId, damId: doeId, lifecycle: gone ? 'junior' : daysBetween(kindledOn, today) > settings.weaningDays ? 'junior' : 'kit',
                disposition: gone ? (random() < 0.6 ? 'processed' : 'sold') : 'on_farm', dispositionOn: gone ? leftOn : undefined,
              });
              if (random() < KEEP_KIT * (sex === 'buck' ? bucksPerFarm / doesPerFarm * 2 : 1)) growing[f]!.push({ kit: { id: kitId, sex, farm: f, birthDate: kindledOn }, readyRound: round + ROUNDS_TO_MATURITY });
            }
            pendingTasks.push(() => {
              const source = { farmId: farms[f], sourceId: litterId, serviceId: null, litterId, animalId: doeId };
              for (const p of planFromKindling(kindledOn, settings)) {
                const t = fromPlan(p, source);
                if (t.kind === 'weaning') {
                  if (weaned) done(t, weanedOn, keeper);
                } else if (t.kind === 'breed_back') {
                  const next = (serviceDates.get(doeId) ?? []).find((d) => d > kindledOn);
                  if (next) done(t, next, keeper);
                  else if (daysBetween(t.dueOn as string, today) > 7) Object.assign(t, { state: 'skipped', stateReason: 'Rested; not bred back' });
                } else if (daysBetween(t.dueOn as string, today) > 2) {
                  done(t, t.dueOn as string, keeper);
                }
                tasks.push(t);
              }
            });
          } else if (!kindles && palpatedOn <= today) {
            services.push({ id, coopId: coop.id, farmId: farms[f], doeId, buckId, servicedOn, status: 'empty', closedOn: palpatedOn, closeReason: `Palpated empty on ${palpatedOn}`, recordedBy: keeper });
            palpations.push({ coopId: coop.id, farmId: farms[f], serviceId: id, palpatedOn, result: 'negative', recordedBy: keeper });
          } else {
            // The current cycle: still open (one open service per doe, as the database insists).
            services.push({ id, coopId: coop.id, farmId: farms[f], doeId, buckId, servicedOn, status: 'open', closedOn: null, closeReason: null, recordedBy: keeper });
            if (palpatedOn <= today) palpations.push({ coopId: coop.id, farmId: farms[f], serviceId: id, palpatedOn, result: 'positive', recordedBy: keeper });
          }
          const status = services.at(-1)!.status as string;
          pendingTasks.push(() => {
            const source = { farmId: farms[f], sourceId: id, serviceId: id, litterId: null, animalId: doeId };
            const own = planFromService(servicedOn, settings).map((p) => fromPlan(p, source));
            if (status !== 'open') own.filter((t) => t.kind === 'palpation').forEach((t) => done(t, palpatedOn, keeper));
            if (status === 'empty') {
              const plan = planAfterPalpation('negative', palpatedOn, settings);
              own.filter((t) => plan.skipKinds.includes(t.kind as never)).forEach((t) => Object.assign(t, { state: 'skipped', stateReason: plan.skipReason }));
              for (const p of plan.tasks) {
                const rebreed = fromPlan(p, source);
                const next = (serviceDates.get(doeId) ?? []).find((d) => d > servicedOn);
                if (next) done(rebreed, next, keeper);
                own.push(rebreed);
              }
            }
            if (status === 'missed') {
              const records: TaskRecord[] = own.map((t, i) => ({ ...(t as unknown as TaskRecord), id: String(i), sourceId: id }));
              const settled = settleServiceTasksOnKindling(records, kindledOn);
              settled.done.forEach((i) => done(own[Number(i)]!, kindledOn, keeper));
              settled.skipped.forEach((k) => Object.assign(own[Number(k.id)]!, { state: 'skipped', stateReason: k.reason }));
              own.filter((t) => t.state === 'open' && t.kind === 'nest_box_in').forEach((t) => done(t, t.dueOn as string, keeper));
            }
            tasks.push(...own);
          });
        }
      }
    }
    for (const plan of pendingTasks) plan();

    // Kits weighed every two weeks from two weeks old while they grow; breeders once a month while kept.
    const weighIns: Record<string, unknown>[] = [];
    for (const a of animals) {
      if (!a.farmId || !a.birthDate) continue;
      const f = farms.indexOf(a.farmId);
      const until = a.dispositionOn && a.dispositionOn < today ? a.dispositionOn : today;
      const first = a.arrivedOn ?? addDays(a.birthDate, WEIGH_EVERY_DAYS);
      for (let on = first; on <= until; ) {
        const age = daysBetween(a.birthDate, on);
        if (a.lifecycle !== 'breeding' && age > GROWTH_WEIGHED_DAYS) break;
        const grams = Math.min(5400, Math.round(60 + age * 28 * Math.exp(-age / 400)));
        weighIns.push({ coopId: coop.id, farmId: a.farmId, animalId: a.id, totalGrams: Math.max(60, grams), headCount: 1, weighedOn: on, enteredBy: users[f], reviewState: 'accepted' });
        on = addDays(on, age < 200 ? WEIGH_EVERY_DAYS : 30);
      }
    }

    const q = (sql: string, bind: unknown[]) => database().query(sql, { bind, transaction: tx });
    await importHerd(coop.id, animals, users[0]!, tx);
    await insertMany(tx, 'services', { id: 'uuid', coopId: 'uuid', farmId: 'uuid', doeId: 'uuid', buckId: 'uuid', servicedOn: 'date', status: 'text', closedOn: 'date', closeReason: 'text', recordedBy: 'uuid' }, services);
    await insertMany(tx, 'palpations', { coopId: 'uuid', farmId: 'uuid', serviceId: 'uuid', palpatedOn: 'date', result: 'text', recordedBy: 'uuid' }, palpations);
    await insertMany(tx, 'litters', { id: 'uuid', coopId: 'uuid', farmId: 'uuid', serviceId: 'uuid', damId: 'uuid', sireId: 'uuid', kindledOn: 'date', bornAlive: 'integer', bornDead: 'integer', recordedBy: 'uuid' }, litters);
    await insertMany(tx, 'litter_events', {
      id: 'uuid', coopId: 'uuid', farmId: 'uuid', litterId: 'uuid', kind: 'text', occurredOn: 'date', kitCount: 'integer', cause: 'text', enteredBy: 'uuid', reviewState: 'text', weaningWeightGrams: 'integer',
    }, events);
    await q(
      `UPDATE services s SET status = 'kindled', closed_on = u.kindled_on, close_reason = NULL, litter_id = u.litter_id
       FROM unnest($1::uuid[], $2::uuid[], $3::date[]) AS u(id, litter_id, kindled_on) WHERE s.id = u.id`,
      [kindledServices.map((k) => k.id), kindledServices.map((k) => k.litterId), kindledServices.map((k) => k.kindledOn)],
    );
    await insertMany(tx, 'weigh_ins', { coopId: 'uuid', farmId: 'uuid', animalId: 'uuid', totalGrams: 'integer', headCount: 'integer', weighedOn: 'date', enteredBy: 'uuid', reviewState: 'text' }, weighIns);
    await insertMany(tx, 'almanac_tasks', {
      coopId: 'uuid', farmId: 'uuid', kind: 'text', key: 'text', anchor: 'text', anchorDate: 'date', sourceId: 'uuid', serviceId: 'uuid', litterId: 'uuid', animalId: 'uuid',
      dueOn: 'date', windowStart: 'date', windowEnd: 'date', ageDays: 'integer', state: 'text', stateReason: 'text', doneOn: 'date', doneBy: 'uuid',
    }, tasks.map((t) => ({ ...t, coopId: coop.id })));

    const doeId = does[0]!.find((id) => byId.get(id)!.sireId) ?? does[0]![0]!;
    const buckIds = [...new Set(bucks.flatMap((list) => list))].slice(0, 12);
    built = {
      coopId: coop.id, slug: opts.slug, email, password: opts.password, farmId: farms[0]!, doeId, buckIds, builtInSeconds: 0,
      counts: {
        farms: FARMS, animals: animals.length, services: services.length, palpations: palpations.length, litters: litters.length, litterEvents: events.length,
        weighIns: weighIns.length, tasks: tasks.length, rounds,
      },
    };
  });
  built.builtInSeconds = Math.round((Date.now() - started) / 1000);
  return built;

  function fromPlan(p: PlannedTask, source: { farmId: string | undefined; sourceId: string; serviceId: string | null; litterId: string | null; animalId: string }): Record<string, unknown> {
    return {
      farmId: source.farmId, kind: p.kind, key: p.key, anchor: p.anchor, anchorDate: p.anchorDate, sourceId: source.sourceId, serviceId: source.serviceId,
      litterId: source.litterId, animalId: source.animalId, dueOn: p.dueOn, windowStart: p.windowStart ?? null, windowEnd: p.windowEnd ?? null,
      ageDays: p.ageDays ?? null, state: 'open', stateReason: null, doneOn: null, doneBy: null,
    };
  }
  function done(t: Record<string, unknown>, on: string, by: string) {
    Object.assign(t, { state: 'done', doneOn: on > today ? today : on, doneBy: by });
  }
}
