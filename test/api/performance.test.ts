import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BreedRow, DoeRow, PerformanceDto } from '@burrowline/shared';
import { daysAgo, farmToday, kindlingAs, palpationAs, serviceAs } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop, type TestPerson } from '../support/factories';
import { addAnimalAs, catalogueBreeds } from '../support/herd';
import { agentFor, ROOMY_SIGN_IN, signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

/** A weaning (with its litter weight) through the API, as a member would enter it on the litter screen. */
async function wean(agent: Agent, litterId: string, on: string, count: number, weaningWeightGrams?: number) {
  const res = await agent.post(`/api/litters/${litterId}/events`).send({ kind: 'weaned', on, count, ...(weaningWeightGrams ? { weaningWeightGrams } : {}) });
  if (res.status !== 201) throw new Error(`weaning failed: ${res.status} ${JSON.stringify(res.body)}`);
}

async function lose(agent: Agent, litterId: string, on: string, count: number) {
  const res = await agent.post(`/api/litters/${litterId}/events`).send({ kind: 'lost', on, count, cause: 'Chilled outside the nest' });
  if (res.status !== 201) throw new Error(`loss failed: ${res.status} ${JSON.stringify(res.body)}`);
}

/**
 * The fixture farm (farm A), every date counted back from the farm's today:
 * - Clover, a New Zealand doe bred to Rusty, a Californian buck: three litters in the last 12 months,
 *   then two services palpated empty.
 *     service 300 d ago → kindled 269 d ago: 8 born alive (+1 dead), 1 lost, 7 weaned at 35 d, 5,250 g
 *     service 230 d ago → kindled 199 d ago: 7 born alive, 1 lost, 6 weaned at 35 d, 4,800 g
 *     service 160 d ago → kindled 129 d ago: 9 born alive, 1 lost, 8 weaned at 35 d, 5,600 g
 *     service  90 d ago → palpated empty 78 d ago;  service 70 d ago → palpated empty 58 d ago
 * - Hazel, a New Zealand doe bred to Baron, a New Zealand buck: two litters.
 *     service 200 d ago → kindled 169 d ago: 10 born alive, 1 lost, 9 weaned at 35 d (not weighed)
 *     service 120 d ago → kindled  89 d ago:  6 born alive, 6 weaned at 35 d, 4,500 g
 * - Clover's third litter grows out as "Clover spring": 8 heads formed 94 d ago (35 d old), weighed
 *   5,600 g (700 g a head), 14,560 g (1,820 g) at 63 d, 18,400 g (2,300 g, past the 2,270 g target) at
 *   70 d; fed 48,000 g; processed 58 d ago at 71 d: 18,400 g live, 10,120 g hot carcass, 9,900 g chilled.
 *   Clover was given 20,000 g while nursing it. Feed: 3 bags × 25 kg for 7,500 cents (0.1 cent a gram).
 */
interface Fixture {
  coop: TestCoop;
  clover: string;
  hazel: string;
  rusty: string;
  baron: string;
  group: string;
}

async function buildFixture(): Promise<Fixture> {
  const coop = await createTestCoop();
  const breeds = await catalogueBreeds(coop.id);
  const nz = breeds['New Zealand']!.id;
  const cal = breeds['Californian']!.id;
  const m: TestPerson = coop.member;
  const agent = await agentOf(m.email);
  const clover = await addAnimalAs(m, { sex: 'doe', name: 'Clover', breedId: nz, birthDate: '2023-01-10' });
  const hazel = await addAnimalAs(m, { sex: 'doe', name: 'Hazel', breedId: nz, birthDate: '2023-02-14' });
  const rusty = await addAnimalAs(m, { sex: 'buck', name: 'Rusty', breedId: cal, birthDate: '2022-11-02' });
  const baron = await addAnimalAs(m, { sex: 'buck', name: 'Baron', breedId: nz, birthDate: '2022-10-01' });

  const litter = async (doeId: string, buckId: string, servicedAgo: number, kindledAgo: number, bornAlive: number, bornDead = 0) => {
    const service = await serviceAs(m, { doeId, buckId, servicedOn: daysAgo(servicedAgo) });
    return (await kindlingAs(m, { serviceId: service.id, kindledOn: daysAgo(kindledAgo), bornAlive, bornDead })).id;
  };
  const c1 = await litter(clover.id, rusty.id, 300, 269, 8, 1);
  await lose(agent, c1, daysAgo(260), 1);
  await wean(agent, c1, daysAgo(234), 7, 5250);
  const c2 = await litter(clover.id, rusty.id, 230, 199, 7);
  await lose(agent, c2, daysAgo(190), 1);
  await wean(agent, c2, daysAgo(164), 6, 4800);
  const c3 = await litter(clover.id, rusty.id, 160, 129, 9);
  await lose(agent, c3, daysAgo(120), 1);
  await wean(agent, c3, daysAgo(94), 8, 5600);
  for (const [servicedAgo, palpatedAgo] of [[90, 78], [70, 58]] as const) {
    const service = await serviceAs(m, { doeId: clover.id, buckId: rusty.id, servicedOn: daysAgo(servicedAgo) });
    await palpationAs(m, service.id, daysAgo(palpatedAgo), 'negative');
  }
  const h1 = await litter(hazel.id, baron.id, 200, 169, 10);
  await lose(agent, h1, daysAgo(160), 1);
  await wean(agent, h1, daysAgo(134), 9);
  const h2 = await litter(hazel.id, baron.id, 120, 89, 6);
  await wean(agent, h2, daysAgo(54), 6, 4500);

  // Clover's third litter grows out as one group: 8 heads formed at weaning (35 d), weighed at 35, 63 and
  // 70 days of age, fed from one purchase, processed together at 71 days.
  const post = async (url: string, body: Record<string, unknown>) => {
    const res = await agent.post(url).send(body);
    if (res.status !== 201) throw new Error(`${url} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body as { id: string };
  };
  const group = await post('/api/grow-out/groups', { name: 'Clover spring', formedOn: daysAgo(94), targetGrams: 2270, litters: [{ litterId: c3, heads: 8 }] });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(94), totalGrams: 5600, headCount: 8 });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(66), totalGrams: 14560, headCount: 8 });
  await post(`/api/grow-out/groups/${group.id}/weigh-ins`, { weighedOn: daysAgo(59), totalGrams: 18400, headCount: 8 });
  // 3 bags of 25 kg for 75.00: 0.1 cent a gram.
  const purchase = { id: randomUUID() };
  await post('/api/feed/purchases', { id: purchase.id, boughtOn: daysAgo(130), productName: 'Grower pellets 16 %', bagGrams: 25000, bags: 3, priceCents: 7500, crudeProteinPercent: 16 });
  await post('/api/feed/uses', { givenOn: daysAgo(100), grams: 20000, purchaseId: purchase.id, target: 'doe', doeId: clover.id });
  await post('/api/feed/uses', { givenOn: daysAgo(60), fromOn: daysAgo(94), grams: 48000, purchaseId: purchase.id, target: 'group', groupId: group.id });
  await post('/api/processing-records', { groupId: group.id, processedOn: daysAgo(58), headCount: 8, liveGrams: 18400, hotCarcassGrams: 10120, chilledCarcassGrams: 9900 });
  return { coop, clover: clover.id, hazel: hazel.id, rusty: rusty.id, baron: baron.id, group: group.id };
}

let fx: Fixture;
beforeAll(async () => {
  fx = await buildFixture();
}, 120_000);

const doeRow = (body: PerformanceDto, id: string) => body.does.find((d) => d.animal.id === id) as DoeRow;

describe('performance tables on a fixture farm worked out by hand', () => {
  it('when a member reads the last 12 months, then each doe\'s figures are the hand-worked ones', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const res = await agent.get('/api/performance');
    expect(res.status).toBe(200);
    const body = res.body as PerformanceDto;
    expect(body).toMatchObject({ farmId: fx.coop.farms[0]!.id, periodChoice: 'last_12_months', today: farmToday(), showsMoney: true });
    expect(body.period).toEqual({ from: daysAgo(364), to: farmToday() });

    // Clover is in production from her first service, 300 days ago, to today: 301 days = 301/365.25 years.
    const years = 301 / 365.25;
    const clover = doeRow(body, fx.clover);
    expect(clover.animal).toMatchObject({ name: 'Clover', breedName: 'New Zealand', onFarm: true });
    expect(clover).toMatchObject({
      services: 5,
      conceptionRate: 0.6, // 3 kindled ÷ (3 kindled + 2 palpated empty)
      missedInARow: 2,
      litters: 3,
      kindlingIntervalDays: 70, // 269 → 199 d ago = 70 d; 199 → 129 d ago = 70 d; mean 70
      averageBornAlive: 8, // (8 + 7 + 9) ÷ 3 = 8.0
      averageWeaned: 7, // (7 + 6 + 8) ÷ 3 = 7.0
      survivalToWeaning: 0.875, // 21 weaned ÷ 24 raised = 87.5 %
    });
    expect(clover.littersPerYear).toBeCloseTo(3 / years, 10); // ≈ 3.64
    expect(clover.kitsWeanedPerYear).toBeCloseTo(21 / years, 10); // ≈ 25.5
    expect(clover.averageLitterWeaningGrams).toBeCloseTo((5250 + 4800 + 5600) / 3, 10); // 5,216.7 g
    // Carcass: all 8 heads of the group came from her third litter, so the whole 10,120 g hot carcass is hers.
    expect(clover.carcassGramsPerYear).toBeCloseTo(10120 / years, 8);
    // Doe + litter to weaning (Kellogg 1933's measure): 20,000 g fed while nursing ÷ 5,600 g weaned = 3.571.
    expect(clover.feedConversionToWeaning).toBeCloseTo(20000 / 5600, 12);
    // To market: (20,000 + 48,000 g) ÷ 18,400 g live at processing = 3.696.
    expect(clover.feedConversionToMarket).toBeCloseTo(68000 / 18400, 12);
    expect(clover.litterGainGramsPerDay).toBeCloseTo(1600 / 35, 12);
    expect(clover.groups).toBe(1);
    // Hazel: 201 days in production (200 d ago to today); 16 raised, 15 weaned; one of two litters weighed.
    const hazel = doeRow(body, fx.hazel);
    expect(hazel).toMatchObject({ services: 2, conceptionRate: 1, missedInARow: 0, litters: 2, kindlingIntervalDays: 80, averageBornAlive: 8, averageWeaned: 7.5, averageLitterWeaningGrams: 4500 });
    expect(hazel.survivalToWeaning).toBeCloseTo(15 / 16, 12);
    expect(hazel.kitsWeanedPerYear).toBeCloseTo(15 / (201 / 365.25), 10);
  });

  it('when a member reads the bucks, then conception rate and the figures of their litters are the hand-worked ones', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const body = (await agent.get('/api/performance')).body as PerformanceDto;
    const rusty = body.bucks.find((b) => b.animal.id === fx.rusty)!;
    // Rusty: 5 services of Clover, 3 kindled, 2 empty → 60 %; litters 8/7/9 born alive, 7/6/8 weaned of 24 raised.
    expect(rusty).toMatchObject({ services: 5, kindled: 3, missed: 2, conceptionRate: 0.6, littersSired: 3, averageBornAlive: 8, averageWeaned: 7, survivalToWeaning: 0.875 });
    expect(rusty.groupGainGramsPerDay).toBeCloseTo(1600 / 35, 12);
    expect(rusty.groups).toBe(1);
    const baron = body.bucks.find((b) => b.animal.id === fx.baron)!;
    expect(baron).toMatchObject({ services: 2, kindled: 2, missed: 0, conceptionRate: 1, littersSired: 2, averageBornAlive: 8, averageWeaned: 7.5 });
  });

  it('when a member reads breeds and crosses, then the cross is named sire first and each figure says how many litters it rests on', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const body = (await agent.get('/api/performance')).body as PerformanceDto;
    const byKey = Object.fromEntries(body.breeds.map((b) => [b.key, b])) as Record<string, BreedRow>;
    const cross = byKey['cross:californian|new zealand']!;
    expect(cross).toMatchObject({ label: 'Californian × New Zealand', kind: 'cross', litters: 3 });
    expect(cross.metrics.bornAlive).toMatchObject({ n: 3, mean: 8, min: 7, max: 9 });
    expect(cross.metrics.bornAlive.sd).toBeCloseTo(1, 12); // sample SD of 8, 7, 9
    expect(cross.metrics.survivalToWeaning.n).toBe(3);
    expect(cross.metrics.survivalToWeaning.mean).toBeCloseTo((7 / 8 + 6 / 7 + 8 / 9) / 3, 12); // per-litter mean
    // One group and one processing record behind the growth, feed and dress-out figures: n says so.
    expect(cross).toMatchObject({ groups: 1, processingRecords: 1 });
    expect(cross.metrics.adgGramsPerDay.n).toBe(1);
    expect(cross.metrics.adgGramsPerDay.mean).toBeCloseTo(1600 / 35, 12);
    expect(cross.metrics.adgGramsPerDay.sd).toBeNull();
    expect(cross.metrics.ageAtTargetDays).toMatchObject({ n: 1, mean: 70 });
    expect(cross.metrics.feedConversion).toMatchObject({ n: 1, mean: 3.75 });
    expect(cross.metrics.dressOutPercent.n).toBe(1);
    expect(cross.metrics.dressOutPercent.mean).toBeCloseTo(55, 10);
    const pure = byKey['pure:new zealand']!;
    expect(pure).toMatchObject({ label: 'New Zealand', kind: 'purebred', litters: 2 });
    expect(pure.metrics.bornAlive).toMatchObject({ n: 2, mean: 8 });
    expect(pure.metrics.survivalToWeaning.mean).toBeCloseTo((9 / 10 + 6 / 6) / 2, 12);
  });

  it('when a member reads the groups, then feed conversion, dress-out and feed cost per weight are the hand-worked ones', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const body = (await agent.get('/api/performance')).body as PerformanceDto;
    const group = body.groups.find((g) => g.id === fx.group)!;
    expect(group).toMatchObject({
      name: 'Clover spring', heads: 8, crossLabel: 'Californian × New Zealand',
      ageAtTargetDays: 70, // born 129 d ago, first at or over 2,270 g 59 d ago
      gainGrams: 12800, // 18,400 g live at processing − 5,600 g at forming
      feedGrams: 48000,
      feedConversion: 3.75, // 48,000 ÷ 12,800; the published grow-out figure on pellets is 3.8 (World Rabbit Science NZW line study)
      hotCarcassGrams: 10120,
      feedCostCents: 4800, // 48,000 g × 0.1 cent
      costPerKgLive: 375, // 4,800 × 1,000 ÷ 12,800
      costPerLbLive: 170, // 4,800 × 453.59237 ÷ 12,800 = 170.10 (NIST HB44 pound)
      costPerKgCarcass: 474, // 4,800 × 1,000 ÷ 10,120 = 474.31
      costPerLbCarcass: 215, // 4,800 × 453.59237 ÷ 10,120 = 215.14
    });
    expect(group.adgGramsPerDay).toBeCloseTo(1600 / 35, 12); // (2,300 − 700 g a head) ÷ 35 days = 45.7 g/day
    expect(group.dressOutPercent).toBeCloseTo(55, 10); // 10,120 ÷ 18,400; Kuzelov & Atanasova 2011: 55–56 % head-on for Cal×NZ
    expect(body.missing).toEqual([]);
  });

  it('when a doe missed her last two services, then culling is suggested with that reason and nothing about her changes', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const before = await asTenant(fx.coop.id, async (c) => (await c.query('SELECT lifecycle, disposition, version FROM animals WHERE id = $1', [fx.clover])).rows[0]);
    const body = (await agent.get('/api/performance')).body as PerformanceDto;
    const clover = body.suggestions.find((s) => s.animal.id === fx.clover)!;
    expect(clover.suggestions[0]).toEqual({ action: 'consider_culling', code: 'missed_in_a_row', reason: 'Her last 2 services missed one after another' });
    // Rabbit Production, 9th ed.: ≈ 35 weaned a year, watched under 25. Hazel's 201 days in service are
    // enough to judge: 15 weaned ÷ (201 ÷ 365.25) = 27.3 a year, pro-rated and said so.
    const hazel = body.suggestions.find((s) => s.animal.id === fx.hazel)!;
    expect(hazel.suggestions).toEqual([{ action: 'keep', code: 'good_record', reason: 'No concerns in her record; 27.3 kits weaned a year (pro-rated from her 201 days in service)' }]);
    expect(doeRow(body, fx.hazel).daysInService).toBe(201);
    // Culling first in the list.
    expect(body.suggestions[0]!.animal.id).toBe(fx.clover);
    const after = await asTenant(fx.coop.id, async (c) => (await c.query('SELECT lifecycle, disposition, version FROM animals WHERE id = $1', [fx.clover])).rows[0]);
    expect(after).toEqual(before);
  });

  it('when does have under a year in service, then each is judged by the same yearly rule, pro-rated, or told plainly there is not enough history', async () => {
    const coop = await createTestCoop();
    const m = coop.member;
    const agent = await agentOf(m.email);
    const juniper = await addAnimalAs(m, { sex: 'doe', name: 'Juniper', birthDate: '2023-03-01' });
    const willow = await addAnimalAs(m, { sex: 'doe', name: 'Willow', birthDate: '2023-04-01' });
    const buck = await addAnimalAs(m, { sex: 'buck', name: 'Ash', birthDate: '2022-10-01' });
    const litter = async (doeId: string, servicedAgo: number, kindledAgo: number, bornAlive: number) => {
      const service = await serviceAs(m, { doeId, buckId: buck.id, servicedOn: daysAgo(servicedAgo) });
      return (await kindlingAs(m, { serviceId: service.id, kindledOn: daysAgo(kindledAgo), bornAlive, bornDead: 0 })).id;
    };
    // Juniper: in service from 200 days ago (201 days); 6 + 5 weaned = 11 → 11 ÷ (201 ÷ 365.25) = 20.0 a year.
    await wean(agent, await litter(juniper.id, 200, 169, 7), daysAgo(134), 6);
    await wean(agent, await litter(juniper.id, 120, 89, 6), daysAgo(54), 5);
    // Willow: in service from 100 days ago (101 days), under the 182 it takes to judge a year's output.
    await wean(agent, await litter(willow.id, 100, 69, 8), daysAgo(34), 7);
    await litter(willow.id, 40, 9, 8);

    const body = (await agent.get('/api/performance')).body as PerformanceDto;
    const suggestionsOf = (id: string) => body.suggestions.find((s) => s.animal.id === id)!.suggestions;
    expect(doeRow(body, juniper.id)).toMatchObject({ daysInService: 201, litters: 2 });
    expect(doeRow(body, juniper.id).kitsWeanedPerYear).toBeCloseTo(11 / (201 / 365.25), 10);
    expect(suggestionsOf(juniper.id)).toEqual([{
      action: 'watch', code: 'low_output',
      reason: '20 kits weaned a year (pro-rated from her 201 days in service), against a target of about 35 (Rabbit Production, 9th ed.)',
    }]);
    expect(doeRow(body, willow.id).daysInService).toBe(101);
    expect(suggestionsOf(willow.id)).toEqual([{
      action: 'too_early', code: 'short_history',
      reason: 'Only 101 days in service in this period: not enough history to judge her yearly output (that takes 182 days)',
    }]);
  });

  it('when the period is all records or a chosen window, then the figures follow the period', async () => {
    const agent = await agentOf(fx.coop.member.email);
    const all = (await agent.get('/api/performance?period=all')).body as PerformanceDto;
    expect(all.period).toEqual({ from: daysAgo(300), to: farmToday() });
    expect(doeRow(all, fx.clover).litters).toBe(3);
    // 250 → 100 days ago: Clover's second and third litters (199 and 129 d ago), Hazel's first (169 d ago).
    const window = (await agent.get(`/api/performance?period=custom&from=${daysAgo(250)}&to=${daysAgo(100)}`)).body as PerformanceDto;
    const clover = doeRow(window, fx.clover);
    expect(clover).toMatchObject({ litters: 2, averageBornAlive: 8, averageWeaned: 7, kindlingIntervalDays: 70 });
    expect(clover.survivalToWeaning).toBeCloseTo(14 / 16, 12);
    expect(doeRow(window, fx.hazel)).toMatchObject({ litters: 1, averageBornAlive: 10, averageWeaned: 9 });
    const backwards = await agent.get(`/api/performance?period=custom&from=${daysAgo(10)}&to=${daysAgo(20)}`);
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.details.to).toEqual(['The period ends before it starts']);
  });
});

describe('performance permissions', () => {
  it('when an apprentice reads the tables, then the figures show and no money does', async () => {
    const agent = await agentOf(fx.coop.apprentice.email);
    const res = await agent.get('/api/performance');
    expect(res.status).toBe(200);
    const body = res.body as PerformanceDto;
    expect(body.showsMoney).toBe(false);
    expect(doeRow(body, fx.clover).averageBornAlive).toBe(8);
    const group = body.groups.find((g) => g.id === fx.group)!;
    expect(group).toMatchObject({ feedGrams: 48000, feedConversion: 3.75 });
    for (const g of body.groups) expect([g.feedCostCents, g.costPerKgLive, g.costPerLbLive, g.costPerKgCarcass, g.costPerLbCarcass]).toEqual([null, null, null, null, null]);
    expect(JSON.stringify(body)).not.toMatch(/"(feedCostCents|costPer\w+)":\d/);
  });

  it('when a member of another farm or another co-op asks for this farm, then it does not exist for them (404); their own farm shows none of it', async () => {
    const farmA = fx.coop.farms[0]!.id;
    const other = await agentOf(fx.coop.otherFarmMember.email);
    const refused = await other.get(`/api/performance?farmId=${farmA}`);
    expect(refused.status).toBe(404);
    const own = (await other.get('/api/performance')).body as PerformanceDto;
    expect(own.farmId).toBe(fx.coop.farms[1]!.id);
    expect(own.does).toEqual([]);
    const stranger = await createTestCoop();
    const outsider = await agentOf(stranger.member.email);
    expect((await outsider.get(`/api/performance?farmId=${farmA}`)).status).toBe(404);
    expect((await agentFor(handle).get('/api/performance')).status).toBe(401);
  });
});
