import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lastTwelveMonths, performanceTables, type PerformanceDto, type PerformanceTables } from '@burrowline/shared';
import { preparedNameOf } from '../../packages/server/src/db/prepared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { COUNTER_SQL } from '../../packages/server/src/modules/performance/performance-cache';
import { serviceOutcomesOfFarm } from '../../packages/server/src/modules/almanac/breeding.service';
import { animalFactsOf } from '../../packages/server/src/modules/animals/animal-facts.service';
import { farmClockOf } from '../../packages/server/src/modules/farms/farm-clock';
import { feedTotalsOfFarm } from '../../packages/server/src/modules/feed/feed-totals.service';
import { growOutFactsOfFarm } from '../../packages/server/src/modules/grow-out/grow-out-facts.service';
import { litterFactsOfFarm } from '../../packages/server/src/modules/litters/litters.service';
import { processingFactsOfFarm } from '../../packages/server/src/modules/processing/processing.service';
import { daysAgo, fosteringAs, kindlingAs, palpationAs, serviceAs } from '../support/almanac';
import { asTenant, ownerDb } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { actorOf, addAnimalAs, catalogueBreeds } from '../support/herd';
import { countingAgentFor, type CountingAgent } from '../support/statement-counter';
import { ROOMY_SIGN_IN, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
afterAll(() => handle.close());

/**
 * The tables as the farm's records give them when each source is read through its own module's published
 * read (one statement per table), the way the tables were first assembled: the one-statement read and the
 * kept answers must give exactly these.
 */
async function tablesFromPublishedReads(coop: TestCoop, period: 'all' | 'last_12_months'): Promise<PerformanceTables> {
  const actor = actorOf(coop.member);
  const farmId = coop.member.farmId!;
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, coop.id, farmId);
    const services = await serviceOutcomesOfFarm(tx, coop.id, farmId, clock.today);
    const litters = await litterFactsOfFarm(tx, coop.id, farmId);
    const feed = await feedTotalsOfFarm(tx, coop.id, farmId);
    const groups = (await growOutFactsOfFarm(tx, coop.id, farmId, { withFeed: false })).map((g) => ({
      ...g, feedGrams: feed.byGroup.get(g.id)?.grams ?? 0, feedCostCents: feed.byGroup.get(g.id)?.costCents ?? 0,
    }));
    const processing = await processingFactsOfFarm(tx, coop.id, farmId);
    const processedIds = processing.filter((r) => r.animalId && !r.groupId).map((r) => r.animalId!);
    const facts = await animalFactsOf(tx, coop.id, [...services.flatMap((s) => [s.doeId, s.buckId]), ...litters.flatMap((l) => [l.damId, l.sireId]), ...processedIds]);
    return performanceTables({
      today: clock.today,
      period: period === 'all' ? null : lastTwelveMonths(clock.today),
      animals: [...facts.values()].map((a) => ({
        id: a.id, name: a.name, tattoo: a.tattoo, sex: a.sex, breedName: a.lineBreedName, onFarm: a.keepingFarmId === farmId && a.disposition === 'on_farm',
      })),
      services,
      litters,
      groups,
      doeLitterFeed: feed.byLitter,
      processing,
      processedAnimals: new Map(processedIds.map((id) => [id, { sireId: facts.get(id)?.sireId ?? null, damId: facts.get(id)?.damId ?? null, birthDate: facts.get(id)?.birthDate ?? null }])),
    });
  });
}

const tablesOf = (body: PerformanceDto): PerformanceTables => {
  const { period, does, bucks, breeds, groups, suggestions, missing } = body;
  return { period, does, bucks, breeds, groups, suggestions, missing };
};

interface Fixture {
  coop: TestCoop;
  counting: CountingAgent;
  doe: string;
  buck: string;
  litter: string;
}

/**
 * A farm with a doe of each breed history: a litter lost and weaned (weighed), a fostering between two
 * litters, a missed service, a group grown out from one litter with weigh-ins, feed for the doe and for
 * the group, and the group processed.
 */
async function buildFixture(): Promise<Fixture> {
  const coop = await createTestCoop();
  const m = coop.member;
  const counting = await countingAgentFor(m.email, TEST_PASSWORD, handle);
  const agent = counting.agent;
  const post = async (url: string, body: Record<string, unknown>) => {
    const res = await agent.post(url).send(body);
    if (res.status !== 201) throw new Error(`${url} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body as { id: string };
  };
  const breeds = await catalogueBreeds(coop.id);
  const doe = await addAnimalAs(m, { sex: 'doe', name: 'Juniper', breedId: breeds['New Zealand']!.id, birthDate: '2023-03-01' });
  const other = await addAnimalAs(m, { sex: 'doe', name: 'Sorrel', breedId: breeds['Californian']!.id, birthDate: '2023-04-01' });
  const buck = await addAnimalAs(m, { sex: 'buck', name: 'Flint', breedId: breeds['Californian']!.id, birthDate: '2022-09-01' });
  const litterOf = async (doeId: string, servicedAgo: number, bornAlive: number) => {
    const service = await serviceAs(m, { doeId, buckId: buck.id, servicedOn: daysAgo(servicedAgo) });
    return (await kindlingAs(m, { serviceId: service.id, kindledOn: daysAgo(servicedAgo - 31), bornAlive, bornDead: 1 })).id;
  };
  const first = await litterOf(doe.id, 480, 9);
  await post(`/api/litters/${first}/events`, { kind: 'lost', on: daysAgo(445), count: 2, cause: 'Chilled outside the nest' });
  await post(`/api/litters/${first}/events`, { kind: 'weaned', on: daysAgo(414), count: 7, weaningWeightGrams: 5100 });
  const oldest = await litterOf(other.id, 560, 7);
  await post(`/api/litters/${oldest}/events`, { kind: 'weaned', on: daysAgo(494), count: 7, weaningWeightGrams: 4900 });
  const oldPurchase = randomUUID();
  await post('/api/feed/purchases', { id: oldPurchase, boughtOn: daysAgo(600), productName: 'Grower pellets 16 %', bagGrams: 25000, bags: 4, priceCents: 9600, crudeProteinPercent: 16 });
  // Grown out before the last 12 months and processed within them: that period's tables still count its
  // carcasses (feed and weigh-ins included); and one grown and processed wholly before them.
  const spring = await post('/api/grow-out/groups', { name: 'Juniper spring', formedOn: daysAgo(414), targetGrams: 2270, litters: [{ litterId: first, heads: 7 }] });
  await post(`/api/grow-out/groups/${spring.id}/weigh-ins`, { weighedOn: daysAgo(414), totalGrams: 5100, headCount: 7 });
  await post(`/api/grow-out/groups/${spring.id}/weigh-ins`, { weighedOn: daysAgo(380), totalGrams: 12600, headCount: 7 });
  await post('/api/feed/uses', { givenOn: daysAgo(380), fromOn: daysAgo(414), grams: 30000, purchaseId: oldPurchase, target: 'group', groupId: spring.id });
  await post('/api/processing-records', { groupId: spring.id, processedOn: daysAgo(350), headCount: 7, liveGrams: 15000, hotCarcassGrams: 8200, chilledCarcassGrams: 8000 });
  const winter = await post('/api/grow-out/groups', { name: 'Sorrel winter', formedOn: daysAgo(494), targetGrams: 2270, litters: [{ litterId: oldest, heads: 7 }] });
  await post(`/api/grow-out/groups/${winter.id}/weigh-ins`, { weighedOn: daysAgo(494), totalGrams: 4900, headCount: 7 });
  await post(`/api/grow-out/groups/${winter.id}/weigh-ins`, { weighedOn: daysAgo(466), totalGrams: 11900, headCount: 7 });
  await post('/api/feed/uses', { givenOn: daysAgo(466), fromOn: daysAgo(494), grams: 26000, purchaseId: oldPurchase, target: 'group', groupId: winter.id });
  await post('/api/processing-records', { groupId: winter.id, processedOn: daysAgo(460), headCount: 7, liveGrams: 14300, hotCarcassGrams: 7800, chilledCarcassGrams: 7650 });
  const litter = await litterOf(doe.id, 160, 8);
  const sorrels = await litterOf(other.id, 158, 6);
  await fosteringAs(m, litter, { direction: 'out', otherLitterId: sorrels, on: daysAgo(127), count: 1 });
  await post(`/api/litters/${litter}/events`, { kind: 'weaned', on: daysAgo(94), count: 7, weaningWeightGrams: 5600 });
  const missed = await serviceAs(m, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(80) });
  await palpationAs(m, missed.id, daysAgo(68), 'negative');

  const group = await post('/api/grow-out/groups', { name: 'Juniper autumn', formedOn: daysAgo(94), targetGrams: 2270, litters: [{ litterId: litter, heads: 7 }] });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(94), totalGrams: 5600, headCount: 7 });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(66), totalGrams: 13300, headCount: 7 });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(59), totalGrams: 16100, headCount: 7 });
  const purchase = randomUUID();
  await post('/api/feed/purchases', { id: purchase, boughtOn: daysAgo(130), productName: 'Grower pellets 16 %', bagGrams: 25000, bags: 3, priceCents: 7500, crudeProteinPercent: 16 });
  await post('/api/feed/uses', { givenOn: daysAgo(100), grams: 18000, purchaseId: purchase, target: 'doe', doeId: doe.id });
  await post('/api/feed/uses', { givenOn: daysAgo(60), fromOn: daysAgo(94), grams: 42000, purchaseId: purchase, target: 'group', groupId: group.id });
  await post('/api/processing-records', { groupId: group.id, processedOn: daysAgo(58), headCount: 7, liveGrams: 16100, hotCarcassGrams: 8900, chilledCarcassGrams: 8700 });
  return { coop, counting, doe: doe.id, buck: buck.id, litter };
}

let fx: Fixture;
beforeAll(async () => {
  fx = await buildFixture();
}, 120_000);

const read = async (period: string) => {
  const counted = await fx.counting.count((agent) => agent.get(`/api/performance?period=${period}`));
  expect(counted.res.status, JSON.stringify(counted.res.body)).toBe(200);
  return counted;
};
const doeRow = (body: PerformanceDto) => body.does.find((d) => d.animal.id === fx.doe)!;

describe('performance tables read in one statement and kept between changes', () => {
  it('when the tables are read (a period reads only what its tables name), then they are exactly the tables worked out from every record through each module\'s published reads', async () => {
    for (const [period, groups] of [['all', 3], ['last_12_months', 1]] as const) {
      const { res } = await read(period);
      const expected = await tablesFromPublishedReads(fx.coop, period);
      expect(expected.groups).toHaveLength(groups);
      // The group grown out before the period and processed in it counts there: its carcasses, its dress-out.
      if (period === 'last_12_months') expect(expected.breeds.some((b) => b.processingRecords > 1)).toBe(true);
      expect(expected.does.length).toBeGreaterThan(0);
      expect(tablesOf(res.body as PerformanceDto)).toEqual(expected);
    }
  });

  it('when nothing changed, then the second read answers the same from what is kept, reading only the co-op\'s counter of its own', async () => {
    // A period not read before: the first read works the tables out.
    const period = `custom&from=${daysAgo(200)}&to=${daysAgo(10)}`;
    const first = await read(period);
    const second = await read(period);
    expect(first.own.length, first.own.join('\n')).toBeLessThanOrEqual(5);
    expect(second.res.body).toEqual(first.res.body);
    expect(second.own.length, second.own.join('\n')).toBeLessThan(first.own.length);
    // The counter's read, as text or (its connection having prepared it already) as the EXECUTE of its prepared name.
    const counterName = preparedNameOf(COUNTER_SQL);
    expect(second.own.some((sql) => sql.includes('performance_versions') || sql.includes(`EXECUTE "${counterName}"`))).toBe(true);
  });

  it('when a service is recorded through the app, then the next read shows it', async () => {
    const before = doeRow((await read('all')).res.body as PerformanceDto);
    await serviceAs(fx.coop.member, { doeId: fx.doe, buckId: fx.buck, servicedOn: daysAgo(50) });
    const after = (await read('all')).res.body as PerformanceDto;
    expect(doeRow(after).services).toBe(before.services + 1);
    expect(tablesOf(after)).toEqual(await tablesFromPublishedReads(fx.coop, 'all'));
  });

  it('when records change in another connection (as through another instance), then the next read shows them', async () => {
    const before = doeRow((await read('all')).res.body as PerformanceDto);
    await asTenant(fx.coop.id, (client) => client.query(`UPDATE litters SET born_alive = born_alive + 2 WHERE id = $1`, [fx.litter]), { commit: true });
    const afterLitter = (await read('all')).res.body as PerformanceDto;
    expect(doeRow(afterLitter).averageBornAlive).toBeCloseTo(before.averageBornAlive! + 1, 10);

    await asTenant(fx.coop.id, (client) => client.query(`UPDATE animals SET name = 'Juniper Mae' WHERE id = $1`, [fx.doe]), { commit: true });
    expect(doeRow((await read('all')).res.body as PerformanceDto).animal.name).toBe('Juniper Mae');

    await asTenant(fx.coop.id, (client) => client.query(`UPDATE weigh_ins SET total_grams = total_grams + 700 WHERE group_id IS NOT NULL AND coop_id = $1 AND weighed_on = $2`, [fx.coop.id, daysAgo(94)]), { commit: true });
    const afterWeighIn = (await read('all')).res.body as PerformanceDto;
    expect(afterWeighIn.groups[0]!.gainGrams).not.toBe(afterLitter.groups[0]!.gainGrams);
    expect(tablesOf(afterWeighIn)).toEqual(await tablesFromPublishedReads(fx.coop, 'all'));
  });

  it('when several screens ask at once after a change, then each gets the changed figures', async () => {
    await asTenant(fx.coop.id, (client) => client.query(`UPDATE animals SET name = 'Juniper Rose' WHERE id = $1`, [fx.doe]), { commit: true });
    const answers = await Promise.all([1, 2, 3].map(() => fx.counting.agent.get('/api/performance?period=all')));
    const expected = await tablesFromPublishedReads(fx.coop, 'all');
    for (const res of answers) {
      expect(res.status).toBe(200);
      expect(doeRow(res.body as PerformanceDto).animal.name).toBe('Juniper Rose');
      expect(tablesOf(res.body as PerformanceDto)).toEqual(expected);
    }
  });

  it('when a data migration changes a record as the owner with no tenant set, then it may still alter the table after, and the next read shows the change', async () => {
    const before = doeRow((await read('all')).res.body as PerformanceDto);
    await ownerDb(async (client) => {
      await client.query('BEGIN');
      await client.query('ALTER TABLE litters NO FORCE ROW LEVEL SECURITY');
      await client.query('UPDATE litters SET born_alive = born_alive + 2 WHERE id = $1', [fx.litter]);
      await client.query('ALTER TABLE litters FORCE ROW LEVEL SECURITY');
      await client.query('COMMIT');
    });
    const after = (await read('all')).res.body as PerformanceDto;
    expect(doeRow(after).averageBornAlive).toBeCloseTo(before.averageBornAlive! + 1, 10);
    expect(tablesOf(after)).toEqual(await tablesFromPublishedReads(fx.coop, 'all'));
  });
});
