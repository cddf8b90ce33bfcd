/**
 * The demo Almanac of Larkspur Hollow: two years of services, palpations, kindlings, losses, fosterings
 * and weanings for the demo farms' does, made from the litters already in their herds (every kit with a
 * record was born of one), with the invented litter sizes and losses a small meat rabbitry sees, and the
 * farms' current cycles placed around today, so Commons and the Almanac have work due today and some
 * overdue at the first sign-in. Planned with the shared planning rules and the published defaults;
 * loaded through the Almanac's and the litters' import services, which check every record. A seeded
 * generator keeps every load the same.
 */
import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import {
  addDays, daysBetween, defaultCycleSettings, planAfterPalpation, planFromKindling, planFromService, settleServiceTasksOnKindling,
  todayIn, type PlannedTask, type TaskRecord,
} from '@burrowline/shared';
import {
  coopHasServices, importServices, importTasks, type ImportedPalpation, type ImportedService, type ImportedTask,
} from '../packages/server/src/modules/almanac/almanac-import.service';
import { coopAnimalFactsOf } from '../packages/server/src/modules/animals/animal-facts.service';
import { importLitters, type ImportedLitter, type ImportedLitterEvent } from '../packages/server/src/modules/litters/litters-import.service';
import { seededRandom } from '../packages/shared/src/pedigree/seeded-random';

export interface DemoAlmanacContext {
  coopId: string;
  /** Farm id by demo farm key. */
  farms: Map<string, string>;
  /** The member who keeps each farm's records, by farm key. */
  keepers: Map<string, string>;
  apprenticeId: string | null;
  /** The Hazelrun apprentice's mentor's farm key. */
  apprenticeFarmKey?: string;
}

const lossCauses = [
  { cause: 'Chilled outside the nest', deathCause: 'chilled' },
  { cause: 'Crushed in the nest box', deathCause: 'trampled' },
  { cause: 'Found dead, cause unknown', deathCause: 'unknown' },
  { cause: 'Born weak, did not nurse', deathCause: 'born_weak' },
] as const;

/** Where a current doe stands today: days since her service, and whether she palpated positive. */
const scenarios = [
  { daysAgo: 12, palpated: false }, // palpation due today
  { daysAgo: 15, palpated: false }, // palpation three days late
  { daysAgo: 28, palpated: true }, // nest box in today
  { daysAgo: 30, palpated: true }, // in the kindling window
  { daysAgo: 33, palpated: true }, // no kits by day 33: overdue
  { daysAgo: 5, palpated: false }, // palpation next week
  { daysAgo: 20, palpated: true },
];

interface LitterGroup {
  farmKey: string;
  farmId: string;
  damId: string;
  sireId: string;
  kindledOn: string;
  recorded: number;
}

export async function loadDemoAlmanac(ctx: DemoAlmanacContext, tx: Transaction): Promise<{ services: number; litters: number; tasks: number } | null> {
  if (await coopHasServices(ctx.coopId, tx)) return null;
  const random = seededRandom(20_260_615);
  const int = (min: number, max: number) => min + Math.floor(random() * (max - min + 1));
  const pick = <T>(list: readonly T[]) => list[Math.floor(random() * list.length)]!;
  const settings = defaultCycleSettings();
  const today = todayIn('America/Chicago');
  const farmKeyOf = new Map([...ctx.farms.entries()].map(([key, id]) => [id, key]));
  const animals = await coopAnimalFactsOf(tx, ctx.coopId);
  const byId = new Map(animals.map((a) => [a.id, a]));

  // Litters in the herds: kits with a record, grouped by their parents and birth date where they were born.
  const groups = new Map<string, LitterGroup>();
  for (const kit of animals) {
    if (!kit.sireId || !kit.damId || !kit.birthDate || !kit.breedingFarmId) continue;
    const dam = byId.get(kit.damId);
    const sire = byId.get(kit.sireId);
    if (!dam || !sire || dam.isOutside || sire.sex !== 'buck') continue;
    const key = `${kit.damId}|${kit.sireId}|${kit.birthDate}`;
    const group = groups.get(key) ?? {
      farmKey: farmKeyOf.get(kit.breedingFarmId)!, farmId: kit.breedingFarmId, damId: kit.damId, sireId: kit.sireId, kindledOn: kit.birthDate, recorded: 0,
    };
    group.recorded += 1;
    groups.set(key, group);
  }
  const byDoe = new Map<string, LitterGroup[]>();
  for (const g of groups.values()) byDoe.set(g.damId, [...(byDoe.get(g.damId) ?? []), g]);

  const services: ImportedService[] = [];
  const palpations: ImportedPalpation[] = [];
  const litters: (ImportedLitter & { recorded: number; farmKey: string })[] = [];
  const serviceDatesOfDoe = new Map<string, string[]>();
  const noteService = (doeId: string, on: string) => serviceDatesOfDoe.set(doeId, [...(serviceDatesOfDoe.get(doeId) ?? []), on].sort());

  const lastKindled = new Map<string, string>();
  const cursorOf = new Map<string, string>();
  for (const [doeId, list] of byDoe) {
    list.sort((a, b) => a.kindledOn.localeCompare(b.kindledOn));
    let cursor: string | null = null;
    for (const g of list) {
      const gestation = pick([30, 31, 31, 31, 32, 32]);
      const servicedOn = addDays(g.kindledOn, -gestation);
      // A litter the Almanac could not have planned (bred before the last one was born): left out.
      if (cursor && servicedOn < cursor) continue;
      const keeper = ctx.keepers.get(g.farmKey) ?? null;
      // Now and then a doe palpated empty first and was rebred the next day.
      const emptyOn = addDays(servicedOn, -13 - int(0, 3));
      if ((!cursor || emptyOn >= cursor) && random() < 0.18 && daysBetween(emptyOn, today) > 0) {
        const id = randomUUID();
        const palpatedOn = addDays(emptyOn, 12);
        services.push({ id, farmId: g.farmId, doeId, buckId: g.sireId, servicedOn: emptyOn, status: 'empty', closedOn: palpatedOn, closeReason: `Palpated empty on ${palpatedOn}`, recordedBy: keeper });
        palpations.push({ serviceId: id, palpatedOn, result: 'negative', recordedBy: keeper });
        noteService(doeId, emptyOn);
      }
      const serviceId = randomUUID();
      services.push({ id: serviceId, farmId: g.farmId, doeId, buckId: g.sireId, servicedOn, status: 'kindled', closedOn: g.kindledOn, closeReason: null, recordedBy: keeper });
      palpations.push({ serviceId, palpatedOn: addDays(servicedOn, 12), result: 'positive', recordedBy: keeper });
      noteService(doeId, servicedOn);
      // Medium meat breeds: 8–12 born is usual (common practice); a few small first litters.
      const size = pick([5, 6, 7, 7, 8, 8, 8, 9, 9, 9, 10, 10, 11, 12]);
      litters.push({
        id: randomUUID(), farmId: g.farmId, farmKey: g.farmKey, serviceId, servicedOn, damId: doeId, sireId: g.sireId, kindledOn: g.kindledOn,
        bornAlive: Math.max(size, g.recorded), bornDead: pick([0, 0, 0, 0, 1, 1, 1, 2]), recordedBy: keeper, recorded: g.recorded,
      });
      lastKindled.set(doeId, g.kindledOn);
      cursor = addDays(g.kindledOn, 7);
    }
    if (cursor) cursorOf.set(doeId, cursor);
  }

  // The farms' current cycles, around today: does that are not nursing a young litter get an open service.
  const scenarioIndex = new Map<string, number>();
  for (const doe of animals) {
    if (doe.sex !== 'doe' || doe.disposition !== 'on_farm' || doe.lifecycle !== 'breeding' || !doe.keepingFarmId) continue;
    const last = lastKindled.get(doe.id);
    if (last && daysBetween(last, today) < 36) continue;
    const farmKey = farmKeyOf.get(doe.keepingFarmId)!;
    const n = scenarioIndex.get(farmKey) ?? (ctx.farms.size - [...ctx.farms.keys()].indexOf(farmKey)) % scenarios.length;
    scenarioIndex.set(farmKey, n + 1);
    const scenario = scenarios[n % scenarios.length]!;
    const servicedOn = addDays(today, -scenario.daysAgo);
    const cursor = cursorOf.get(doe.id);
    if (cursor && servicedOn < cursor) continue;
    const bucks = animals.filter((b) => b.sex === 'buck' && b.keepingFarmId === doe.keepingFarmId && b.disposition === 'on_farm' && b.lifecycle === 'breeding' && b.id !== doe.sireId);
    if (bucks.length === 0) continue;
    const keeper = ctx.keepers.get(farmKey) ?? null;
    const id = randomUUID();
    services.push({ id, farmId: doe.keepingFarmId, doeId: doe.id, buckId: pick(bucks).id, servicedOn, status: 'open', closedOn: null, closeReason: null, recordedBy: keeper });
    if (scenario.palpated) palpations.push({ serviceId: id, palpatedOn: addDays(servicedOn, 12), result: 'positive', recordedBy: keeper });
    noteService(doe.id, servicedOn);
  }

  // Kit counts: early losses, the odd cull, fosterings between does that kindled within two days, weaning at about six weeks.
  const events: ImportedLitterEvent[] = [];
  const onDoe = new Map(litters.map((l) => [l.id, l.bornAlive]));
  const spare = (l: (typeof litters)[number]) => onDoe.get(l.id)! - l.recorded;
  for (const l of litters) {
    const keeper = l.recordedBy;
    const losses = Math.min(spare(l), pick([0, 0, 0, 1, 1, 1, 2, 2, 3]));
    if (losses > 0 && addDays(l.kindledOn, 2) <= today) {
      events.push({ id: randomUUID(), litterId: l.id, kind: 'lost', on: addDays(l.kindledOn, int(1, 2)), count: losses, ...pick(lossCauses), enteredBy: keeper });
      onDoe.set(l.id, onDoe.get(l.id)! - losses);
    }
    if (spare(l) > 0 && random() < 0.08 && addDays(l.kindledOn, 10) <= today) {
      events.push({ id: randomUUID(), litterId: l.id, kind: 'culled', on: addDays(l.kindledOn, int(6, 10)), count: 1, cause: 'Runt, not thriving', enteredBy: keeper });
      onDoe.set(l.id, onDoe.get(l.id)! - 1);
    }
  }
  const sorted = [...litters].sort((a, b) => a.kindledOn.localeCompare(b.kindledOn));
  const fostered = new Set<string>();
  for (const a of sorted) {
    if (fostered.has(a.id)) continue;
    const b = sorted.find((x) => x.id !== a.id && x.farmId === a.farmId && !fostered.has(x.id) && Math.abs(daysBetween(a.kindledOn, x.kindledOn)) <= 2);
    if (!b) continue;
    const [big, small] = onDoe.get(a.id)! >= onDoe.get(b.id)! ? [a, b] : [b, a];
    const moved = Math.min(spare(big), onDoe.get(big.id)! - onDoe.get(small.id)! >= 4 ? 2 : 1);
    const on = addDays(big.kindledOn > small.kindledOn ? big.kindledOn : small.kindledOn, 1);
    if (moved < 1 || on > today) continue;
    const pairId = randomUUID();
    events.push({ id: randomUUID(), litterId: big.id, kind: 'fostered_out', on, count: moved, otherLitterId: small.id, pairId, enteredBy: big.recordedBy });
    events.push({ id: randomUUID(), litterId: small.id, kind: 'fostered_in', on, count: moved, otherLitterId: big.id, pairId, enteredBy: big.recordedBy });
    onDoe.set(big.id, onDoe.get(big.id)! - moved);
    onDoe.set(small.id, onDoe.get(small.id)! + moved);
    fostered.add(big.id).add(small.id);
  }
  const weanedOn = new Map<string, string>();
  for (const l of litters) {
    const age = daysBetween(l.kindledOn, today);
    // Litters six to seven weeks old are left unweaned: the Almanac shows their weaning as late.
    if (age < 48) continue;
    const on = addDays(l.kindledOn, settings.weaningDays + int(-2, 3));
    // Most weanings are weighed, the litter together: about 22–27 g a kit per day of age, near the
    // reference curve's 1,050 g at six weeks (growth/gompertz.ts; Rao et al. 1977: 28.8 g/d to 8 weeks).
    // Derived from the litter's id, so the rest of the demo's random draws stay as they were.
    const spread = parseInt(l.id.slice(0, 4), 16);
    const kits = onDoe.get(l.id)!;
    const weaningWeightGrams = kits > 0 && spread % 7 !== 0 ? Math.round(kits * daysBetween(l.kindledOn, on) * (22 + (spread % 6))) : null;
    events.push({ id: randomUUID(), litterId: l.id, kind: 'weaned', on, count: kits, enteredBy: l.recordedBy, weaningWeightGrams });
    weanedOn.set(l.id, on);
    onDoe.set(l.id, 0);
  }

  // The Hazelrun apprentice's loss on a nursing litter waits for the mentor's review.
  const apprenticeFarm = ctx.farms.get(ctx.apprenticeFarmKey ?? 'hazelrun');
  const nursing = litters.find((l) => l.farmId === apprenticeFarm && !weanedOn.has(l.id) && spare(l) > 0 && daysBetween(l.kindledOn, today) >= 3);
  if (ctx.apprenticeId && nursing) {
    events.push({ id: randomUUID(), litterId: nursing.id, kind: 'lost', on: addDays(today, -1), count: 1, cause: 'Found outside the nest box, cold', deathCause: 'chilled', enteredBy: ctx.apprenticeId, reviewState: 'pending' });
  }

  // Tasks, planned as the Almanac plans them, with the states the history left them in.
  const tasks: ImportedTask[] = [];
  const fromPlan = (p: PlannedTask, source: { farmId: string; sourceId: string; serviceId: string | null; litterId: string | null; animalId: string }): ImportedTask => ({
    farmId: source.farmId, kind: p.kind, key: p.key, anchor: p.anchor, anchorDate: p.anchorDate, sourceId: source.sourceId, serviceId: source.serviceId,
    litterId: source.litterId, animalId: source.animalId, dueOn: p.dueOn, windowStart: p.windowStart ?? null, windowEnd: p.windowEnd ?? null,
    ageDays: p.ageDays ?? null, state: 'open', stateReason: null, doneOn: null, doneBy: null,
  });
  const done = (t: ImportedTask, on: string, by: string | null) => Object.assign(t, { state: 'done' as const, doneOn: on, doneBy: by });
  const skip = (t: ImportedTask, reason: string) => Object.assign(t, { state: 'skipped' as const, stateReason: reason });
  const nextServiceAfter = (doeId: string, date: string) => (serviceDatesOfDoe.get(doeId) ?? []).find((d) => d > date) ?? null;
  const litterOfService = new Map(litters.map((l) => [l.serviceId, l]));

  for (const s of services) {
    const source = { farmId: s.farmId, sourceId: s.id, serviceId: s.id, litterId: null, animalId: s.doeId };
    const own = planFromService(s.servicedOn, settings).map((p) => fromPlan(p, source));
    const palpation = palpations.find((p) => p.serviceId === s.id);
    if (palpation) own.filter((t) => t.kind === 'palpation').forEach((t) => done(t, palpation.palpatedOn, s.recordedBy));
    if (s.status === 'empty') {
      const plan = planAfterPalpation('negative', s.closedOn!, settings);
      own.filter((t) => plan.skipKinds.includes(t.kind)).forEach((t) => skip(t, plan.skipReason!));
      for (const p of plan.tasks) {
        const rebreed = fromPlan(p, source);
        const next = nextServiceAfter(s.doeId, s.servicedOn);
        if (next) done(rebreed, next, s.recordedBy);
        own.push(rebreed);
      }
    }
    const litter = litterOfService.get(s.id);
    if (litter) {
      const records: TaskRecord[] = own.map((t, i) => ({ ...t, id: String(i), sourceId: s.id }));
      const settled = settleServiceTasksOnKindling(records, litter.kindledOn);
      settled.done.forEach((i) => done(own[Number(i)]!, litter.kindledOn, s.recordedBy));
      settled.skipped.forEach((k) => skip(own[Number(k.id)]!, k.reason));
      own.filter((t) => t.state === 'open' && t.kind === 'nest_box_in').forEach((t) => done(t, t.dueOn, s.recordedBy));
    }
    tasks.push(...own);
  }
  for (const l of litters) {
    const source = { farmId: l.farmId, sourceId: l.id, serviceId: null, litterId: l.id, animalId: l.damId };
    for (const t of planFromKindling(l.kindledOn, settings).map((p) => fromPlan(p, source))) {
      if (t.kind === 'weaning') {
        if (weanedOn.has(l.id)) done(t, weanedOn.get(l.id)!, l.recordedBy);
      } else if (t.kind === 'breed_back') {
        const next = nextServiceAfter(l.damId, l.kindledOn);
        if (next) done(t, next, l.recordedBy);
        else if (daysBetween(t.dueOn, today) > 7) skip(t, 'Rested; not bred back');
      } else if (daysBetween(t.dueOn, today) > 2) {
        done(t, t.dueOn, l.recordedBy);
      }
      tasks.push(t);
    }
  }
  // The apprentice ticked one of today's Hazelrun jobs; it waits for the mentor.
  const todays = tasks.find((t) => t.farmId === apprenticeFarm && t.state === 'open' && t.dueOn === today);
  if (ctx.apprenticeId && todays) Object.assign(todays, { state: 'done', doneOn: today, doneBy: ctx.apprenticeId, completionReview: 'pending' as const });

  await importServices(tx, ctx.coopId, today, services, palpations);
  await importLitters(tx, ctx.coopId, today, litters.map(({ recorded: _r, farmKey: _f, ...l }) => l), events);
  await importTasks(tx, ctx.coopId, tasks);
  return { services: services.length, litters: litters.length, tasks: tasks.length };
}

