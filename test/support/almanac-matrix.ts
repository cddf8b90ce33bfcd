import { randomUUID } from 'node:crypto';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { renewCalendarFeed } from '../../packages/server/src/modules/almanac/calendar-feed.service';
import { updateTask } from '../../packages/server/src/modules/almanac/tasks.service';
import { createHousingUnit, placeInUnit } from '../../packages/server/src/modules/litters/housing.service';
import { recordLitterEvent } from '../../packages/server/src/modules/litters/litters.service';
import { almanacCounts, breedingPair, daysAgo, farmToday, litterAs, serviceAs } from './almanac';
import { asTenant } from './db';
import { feedAs, grownLitterAs, groupAs, purchaseAs } from './grow-out';
import type { TestCoop } from './factories';
import { markAs } from './health-yield';
import { actorOf, nextTattoo } from './herd';

/** Almanac and litter objects for the authorization matrix, made fresh for every cell (all on farm A). */
export interface AlmanacIds {
  doeId?: string;
  buckId?: string;
  serviceId?: string;
  taskId?: string;
  litterId?: string;
  otherLitterId?: string;
  eventId?: string;
  unitId?: string;
  placementId?: string;
  feedToken?: string;
  markId?: string;
  /** Grow-out: a growing group of farm A with a litter that still has free kits, and a feed purchase. */
  groupId?: string;
  /** Feed corrections: a purchase of farm A and feed given from it to the group. */
  purchaseId?: string;
  useId?: string;
  productName?: string;
}

export async function almanacTarget(coop: TestCoop, target: string): Promise<AlmanacIds> {
  connectDatabase(process.env.DATABASE_URL!);
  switch (target) {
    case 'breedingPairA': {
      const { doe, buck } = await breedingPair(coop.member);
      return { doeId: doe.id, buckId: buck.id };
    }
    case 'serviceA': {
      const { doe, buck } = await breedingPair(coop.member);
      const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(31) });
      return { doeId: doe.id, buckId: buck.id, serviceId: service.id, taskId: service.tasks.find((t) => t.kind === 'palpation')!.id };
    }
    case 'pendingTaskA': {
      const { doe, buck } = await breedingPair(coop.member);
      const service = await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(12) });
      const task = service.tasks.find((t) => t.kind === 'palpation')!;
      await updateTask(actorOf(coop.apprentice), task.id, { action: 'done', version: task.version });
      return { serviceId: service.id, taskId: task.id };
    }
    case 'litterA': {
      const a = await litterAs(coop.member, { servicedDaysAgo: 33, kindledDaysAgo: 2, bornAlive: 10 });
      const b = await litterAs(coop.member, { servicedDaysAgo: 32, kindledDaysAgo: 1, bornAlive: 4 });
      return { litterId: a.litter.id, otherLitterId: b.litter.id, doeId: a.doe.id };
    }
    case 'litterEventA': {
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: 33, kindledDaysAgo: 2, bornAlive: 8 });
      const after = await recordLitterEvent(actorOf(coop.apprentice), litter.id, { kind: 'lost', on: farmToday(), count: 1, cause: 'Matrix loss' });
      return { litterId: litter.id, eventId: after.events[0]!.id };
    }
    case 'housingA': {
      const { doe } = await breedingPair(coop.member);
      const unit = await createHousingUnit(actorOf(coop.member), { name: `H-${randomUUID().slice(0, 6)}`, kind: 'hutch', capacity: null, notes: '' });
      return { unitId: unit.id, doeId: doe.id };
    }
    case 'placementA': {
      const { doe } = await breedingPair(coop.member);
      const unit = await createHousingUnit(actorOf(coop.member), { name: `P-${randomUUID().slice(0, 6)}`, kind: 'pen', capacity: null, notes: '' });
      const placed = await placeInUnit(actorOf(coop.member), unit.id, { animalId: doe.id, placedOn: daysAgo(3), note: '' });
      return { unitId: unit.id, placementId: placed.current[0]!.id };
    }
    case 'groupA': {
      const { litter } = await grownLitterAs(coop.member, 45, 6);
      const group = await groupAs(coop.member, { name: `G-${randomUUID().slice(0, 6)}`, formedOn: daysAgo(3), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 3 }] });
      await purchaseAs(coop.member, { boughtOn: daysAgo(5), productName: 'Matrix feed', bagGrams: 20_000, bags: 1, priceCents: 1500 });
      return { groupId: group.id, litterId: litter.id };
    }
    case 'feedEntriesA': {
      const { litter } = await grownLitterAs(coop.member, 45, 6);
      const group = await groupAs(coop.member, { name: `G-${randomUUID().slice(0, 6)}`, formedOn: daysAgo(3), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 3 }] });
      // A feed of its own, so the purchase and the entry are found among the other cells' feed.
      const productName = `Matrix feed ${randomUUID().slice(0, 6)}`;
      const bought = (await purchaseAs(coop.member, { boughtOn: daysAgo(5), productName, bagGrams: 20_000, bags: 1, priceCents: 1500 })).purchases.find((p) => p.productName === productName)!;
      const given = (await feedAs(coop.member, { givenOn: daysAgo(1), grams: 900, purchaseId: bought.id, target: 'group', groupId: group.id })).uses.find((u) => u.productName === productName)!;
      return { groupId: group.id, purchaseId: bought.id, useId: given.id, productName };
    }
    case 'processingMarkA': {
      const { doe } = await breedingPair(coop.member);
      const mark = await markAs(coop.member, { animalId: doe.id, plannedOn: farmToday() });
      return { doeId: doe.id, markId: mark.id };
    }
    case 'feedA': {
      const feed = await renewCalendarFeed(actorOf(coop.member), 'http://127.0.0.1:3000');
      return { feedToken: /calendar-feeds\/(.+)\.ics$/.exec(feed.url!)![1] };
    }
    default:
      return {};
  }
}

/** Request bodies of the Almanac's rows; undefined for bodies that are not the Almanac's. */
export async function almanacBody(coop: TestCoop, body: string | undefined, ids: AlmanacIds, ownCoopId: string, ownFarmId: string | null): Promise<object | undefined> {
  const version = async (table: string, id: string | undefined) =>
    id ? ((await asTenant(coop.id, (c) => c.query(`SELECT version FROM ${table} WHERE id = $1`, [id]))).rows[0]?.version ?? 0) : 0;
  switch (body) {
    case 'growOutGroup':
      return { name: 'Matrix group', formedOn: farmToday(), targetGrams: 2270, litters: [{ litterId: ids.litterId, heads: 1 }] };
    case 'groupWeighIn':
      return { weighedOn: farmToday(), totalGrams: 3 * 1250, headCount: 3 };
    case 'weighingRound':
      return { id: randomUUID(), weighedOn: farmToday(), entries: [1250, 1300, 1200].map((grams) => ({ groupId: ids.groupId, grams })) };
    case 'groupClose':
      return { closedOn: farmToday(), version: await version('grow_out_groups', ids.groupId) };
    case 'feedPurchase':
      return { boughtOn: farmToday(), productName: 'Matrix pellets', bagGrams: 22_680, bags: 1, priceCents: 1999 };
    case 'feedUse':
      return { givenOn: farmToday(), grams: 500, productName: 'Matrix feed', target: 'group', groupId: ids.groupId };
    case 'feedPurchaseCorrection':
      return { boughtOn: daysAgo(5), productName: ids.productName, bagGrams: 20_000, bags: 2, priceCents: 2900, version: await version('feed_purchases', ids.purchaseId) };
    case 'feedUseCorrection':
      return { givenOn: daysAgo(1), grams: 800, purchaseId: ids.purchaseId, target: 'group', groupId: ids.groupId, version: await version('feed_uses', ids.useId) };
    case 'cycleSettings': {
      const row = ownFarmId ? (await asTenant(ownCoopId, (c) => c.query('SELECT version FROM farm_cycle_settings WHERE farm_id = $1', [ownFarmId]))).rows[0] : null;
      return { palpationDays: 13, version: row?.version ?? 0 };
    }
    case 'service':
      return { doeId: ids.doeId, buckId: ids.buckId, servicedOn: daysAgo(1) };
    case 'palpation':
      return { palpatedOn: farmToday(), result: 'positive' };
    case 'closure':
      return { closedOn: farmToday(), reason: 'Matrix', version: await version('services', ids.serviceId) };
    case 'taskDone':
      return { action: 'done', version: await version('almanac_tasks', ids.taskId) };
    case 'taskSkip':
      return { action: 'skip', reason: 'Matrix', version: await version('almanac_tasks', ids.taskId) };
    case 'taskBulk':
      return { action: 'done', tasks: [{ id: ids.taskId, version: await version('almanac_tasks', ids.taskId) }] };
    case 'taskReview':
      return { decision: 'accepted', version: await version('almanac_tasks', ids.taskId) };
    case 'treatment':
      return { animalId: ids.doeId, startedOn: farmToday(), lastDoseOn: farmToday(), withdrawalDays: 0, treatment: 'Matrix treatment', dose: '1 ml', route: 'oral', veterinarian: 'Dr. Matrix' };
    case 'temperatureReading':
      return { value: 72, unit: 'F', place: 'Matrix barn' };
    case 'processingRecord':
      return { animalId: ids.doeId, processedOn: farmToday(), liveGrams: 4200, hotCarcassGrams: 2300 };
    case 'processingMark':
      return { animalId: ids.doeId, plannedOn: farmToday() };
    case 'markCancellation':
      return { version: await version('processing_marks', ids.markId) };
    case 'morningEmail':
      return { enabled: false, hour: 6 };
    case 'kindling':
      return { serviceId: ids.serviceId, kindledOn: farmToday(), bornAlive: 8, bornDead: 0 };
    case 'litterLoss':
      return { kind: 'lost', on: farmToday(), count: 1, cause: 'Matrix' };
    case 'fostering':
      return { direction: 'out', otherLitterId: ids.otherLitterId, on: farmToday(), count: 1 };
    case 'keeper':
      return { tattoo: nextTattoo('MK'), sex: 'doe' };
    case 'litterReview':
      return { decision: 'accepted', version: await version('litter_events', ids.eventId) };
    case 'housingUnit':
      return { name: `Matrix ${randomUUID().slice(0, 6)}`, kind: 'pen' };
    case 'placement':
      return { animalId: ids.doeId, placedOn: farmToday() };
    case 'placementEnd':
      return { endedOn: farmToday() };
    default:
      return undefined;
  }
}

/** What a refused Almanac call must leave as it was: every Almanac table's rows of the co-op, task states and versions. */
export async function almanacStateOf(coopId: string) {
  const feedBook = await asTenant(coopId, async (c) => ({
    purchases: (await c.query(`SELECT string_agg(id || ':' || version || ':' || (deleted_at IS NULL), ',' ORDER BY id) AS s FROM feed_purchases WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
    uses: (await c.query(`SELECT string_agg(id || ':' || version || ':' || (deleted_at IS NULL), ',' ORDER BY id) AS s FROM feed_uses WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
    marks: (await c.query(`SELECT string_agg(id || ':' || status || ':' || version, ',' ORDER BY id) AS s FROM processing_marks WHERE coop_id = $1`, [coopId])).rows[0].s as string | null,
  }));
  return { ...(await almanacCounts(coopId)), feedBook };
}
