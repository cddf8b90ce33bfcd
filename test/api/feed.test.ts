import { afterAll, describe, expect, it } from 'vitest';
import { addDays, type FeedOverviewDto, type GrowOutGroupDto } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { doeLitterFeedOfFarm } from '../../packages/server/src/modules/feed/feed.service';
import { createHousingUnit } from '../../packages/server/src/modules/litters/housing.service';
import { actorOf } from '../support/herd';
import { daysAgo, farmToday } from '../support/almanac';
import { asTenant } from '../support/db';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { feedAs, grownLitterAs, groupAs, growOutCounts, purchaseAs, weighGroupAs } from '../support/grow-out';
import { agentFor, ROOMY_SIGN_IN, signedInAgent, testApp } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
const agentOf = (email: string) => signedInAgent(email, TEST_PASSWORD, handle);
afterAll(async () => {
  await handle.close();
});

/** A 50 lb bag is 22,680 g to the gram (NIST Handbook 44: 1 lb = 453.59237 g → 22,679.6 g). */
const BAG_50_LB = 22_680;

async function twoGroups(coop: TestCoop) {
  const one = await grownLitterAs(coop.member, 50, 8);
  const two = await grownLitterAs(coop.member, 50, 4);
  const big = await groupAs(coop.member, { name: 'Eight', formedOn: daysAgo(20), targetGrams: 2270, litters: [{ litterId: one.litter.id, heads: 8 }] });
  const small = await groupAs(coop.member, { name: 'Four', formedOn: daysAgo(20), targetGrams: 2270, litters: [{ litterId: two.litter.id, heads: 4 }] });
  return { big, small };
}

describe('feed purchases', () => {
  it('when a member records a purchase, then grams and cents are stored, the stock and price per kg shown; an apprentice sees no money', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const res = await agent.post('/api/feed/purchases').send({ boughtOn: daysAgo(3), productName: 'Grower pellets 16%', bagGrams: BAG_50_LB, bags: 2, priceCents: 3798, crudeProteinPercent: 16 });
    expect(res.status).toBe(201);
    const book = res.body as FeedOverviewDto;
    // 3,798 cents ÷ 45.36 kg = 83.73 → 84 cents a kg.
    expect(book.purchases).toEqual([expect.objectContaining({ productName: 'Grower pellets 16%', bagGrams: BAG_50_LB, bags: 2, grams: 45_360, gramsLeft: 45_360, crudeProteinPercent: 16, priceCents: 3798, centsPerKg: 84 })]);
    expect(book.products).toEqual([{ name: 'Grower pellets 16%', gramsLeft: 45_360 }]);
    const row = await asTenant(coop.id, async (c) => (await c.query('SELECT farm_id, bag_grams, bags, price_cents::int AS price_cents, crude_protein_percent::float AS cp, entered_by FROM feed_purchases WHERE coop_id = $1', [coop.id])).rows);
    expect(row).toEqual([{ farm_id: coop.farms[0]!.id, bag_grams: BAG_50_LB, bags: 2, price_cents: 3798, cp: 16, entered_by: coop.member.id }]);

    const apprentice = await agentOf(coop.apprentice.email);
    const seen = (await apprentice.get('/api/feed')).body as FeedOverviewDto;
    expect(seen.canSeeMoney).toBe(false);
    expect(seen.purchases[0]).toMatchObject({ grams: 45_360, priceCents: null, centsPerKg: null });
    expect(JSON.stringify(seen)).not.toContain('3798');
    const refused = await apprentice.post('/api/feed/purchases').send({ boughtOn: farmToday(), productName: 'Hay', bagGrams: 20_000, bags: 1, priceCents: 900 });
    expect(refused.status).toBe(403);
  });

  it('when a purchase has a negative price, no bags or a future date, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const agent = await agentOf(coop.member.email);
    const before = await growOutCounts(coop.id);
    const bad = await agent.post('/api/feed/purchases').send({ boughtOn: farmToday(), productName: 'Grower', bagGrams: BAG_50_LB, bags: 0, priceCents: -5 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toMatchObject({ bags: ['At least one bag'], priceCents: ['A price cannot be negative'] });
    const future = await agent.post('/api/feed/purchases').send({ boughtOn: addDays(farmToday(), 2), productName: 'Grower', bagGrams: BAG_50_LB, bags: 1, priceCents: 1899 });
    expect(future.status).toBe(400);
    expect(future.body.error.details.boughtOn).toEqual(['A purchase cannot be dated in the future']);
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('feed given', () => {
  it('when feed is given to a group across two purchases, then it is costed first bought first used and the group shows feed conversion and cost per lb', async () => {
    const coop = await createTestCoop();
    const { litter } = await grownLitterAs(coop.member, 56, 4);
    const group = await groupAs(coop.member, { name: 'Fryers', formedOn: daysAgo(28), targetGrams: 2270, litters: [{ litterId: litter.id, heads: 4 }] });
    await weighGroupAs(coop.member, group.id, { weighedOn: daysAgo(28), totalGrams: 4 * 550, headCount: 4 });
    await weighGroupAs(coop.member, group.id, { weighedOn: farmToday(), totalGrams: 4 * 1650, headCount: 4 });
    await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    await purchaseAs(coop.member, { boughtOn: daysAgo(20), productName: 'grower', bagGrams: 10_000, bags: 1, priceCents: 2000 });
    const agent = await agentOf(coop.member.email);
    const first = await agent.post('/api/feed/uses').send({ givenOn: daysAgo(15), fromOn: daysAgo(28), grams: 8000, productName: 'Grower', target: 'group', groupId: group.id });
    expect(first.status).toBe(201);
    const res = await agent.post('/api/feed/uses').send({ givenOn: farmToday(), fromOn: daysAgo(14), grams: 8000, productName: 'GROWER', target: 'group', groupId: group.id });
    expect(res.status).toBe(201);
    const book = res.body as FeedOverviewDto;
    // FIFO: the first 8,000 g from the $10 bag (800 ¢); then 2,000 g left of it (200 ¢) and 6,000 g of the $20 bag (1,200 ¢) = 1,400 ¢.
    expect(book.uses.map((u) => [u.grams, u.costCents, u.targetLabel])).toEqual([[8000, 1400, 'Fryers'], [8000, 800, 'Fryers']]);
    expect(book.purchases.map((p) => p.gramsLeft)).toEqual([4000, 0]);
    const detail = (await agent.get(`/api/grow-out/groups/${group.id}`)).body as GrowOutGroupDto;
    // Gain 6,600 − 2,200 = 4,400 g; 16,000 ÷ 4,400 = 3.64, near the published 3.8 on pellets (NZW post-weaning line study, World Rabbit Science).
    expect(detail.feed).toMatchObject({ feedGrams: 16_000, gainGrams: 4400, feedCostCents: 2200, publishedConversion: { ratio: 3.8 } });
    expect(detail.feed.conversion).toBeCloseTo(16_000 / 4400, 9);
    // 2,200 ¢ ÷ 4.4 kg = 500 ¢/kg; per lb 2,200 × 453.59237 ÷ 4,400 = 226.8 → 227 ¢ (NIST HB44 pound).
    expect(detail.feed.costPerKgLiveCents).toBe(500);
    expect(detail.feed.costPerLbLiveCents).toBe(227);
    const rows = await asTenant(coop.id, async (c) => (await c.query(`SELECT u.grams, u.feed_key, u.target, s.group_id, s.grams AS share FROM feed_uses u JOIN feed_use_shares s ON s.feed_use_id = u.id WHERE u.coop_id = $1 ORDER BY u.given_on`, [coop.id])).rows);
    expect(rows).toEqual([
      { grams: 8000, feed_key: 'grower', target: 'group', group_id: group.id, share: 8000 },
      { grams: 8000, feed_key: 'grower', target: 'group', group_id: group.id, share: 8000 },
    ]);
  });

  it('when feed is given to the whole farm, then it is split over the groups by head-days or by live weight, to the gram', async () => {
    const coop = await createTestCoop();
    const { big, small } = await twoGroups(coop);
    await weighGroupAs(coop.member, big.id, { weighedOn: daysAgo(1), totalGrams: 8 * 1000, headCount: 8 });
    await weighGroupAs(coop.member, small.id, { weighedOn: daysAgo(1), totalGrams: 4 * 1500, headCount: 4 });
    await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Grower', bagGrams: BAG_50_LB, bags: 1, priceCents: 2000 });
    const agent = await agentOf(coop.member.email);
    // Seven days, 8 heads and 4 heads: 56 and 28 head-days, so 2 : 1 → 7,000 g and 3,500 g (worked by hand).
    const byHeads = await agent.post('/api/feed/uses').send({ givenOn: daysAgo(1), fromOn: daysAgo(7), grams: 10_500, productName: 'Grower', target: 'farm', allocation: 'head_days' });
    expect(byHeads.status).toBe(201);
    const shares = (byHeads.body as FeedOverviewDto).uses[0]!.shares;
    expect(shares).toEqual(expect.arrayContaining([
      { groupId: big.id, litterId: null, label: 'Eight', grams: 7000 },
      { groupId: small.id, litterId: null, label: 'Four', grams: 3500 },
    ]));
    // Live weight on the day: 8,000 g and 6,000 g → 4 : 3 of 7,000 g = 4,000 g and 3,000 g.
    const byWeight = await agent.post('/api/feed/uses').send({ givenOn: daysAgo(1), grams: 7000, productName: 'Grower', target: 'farm', allocation: 'live_weight' });
    expect(byWeight.status).toBe(201);
    expect((byWeight.body as FeedOverviewDto).uses.find((u) => u.allocation === 'live_weight')!.shares).toEqual(expect.arrayContaining([
      expect.objectContaining({ groupId: big.id, grams: 4000 }),
      expect.objectContaining({ groupId: small.id, grams: 3000 }),
    ]));
    const totals = await asTenant(coop.id, async (c) => (await c.query(`SELECT group_id, sum(grams)::int AS grams FROM feed_use_shares WHERE coop_id = $1 GROUP BY group_id`, [coop.id])).rows);
    expect(Object.fromEntries(totals.map((r) => [r.group_id, r.grams]))).toEqual({ [big.id]: 11_000, [small.id]: 6_500 });
  });

  it('when feed is given to a pen, then only the groups in that pen share it', async () => {
    const coop = await createTestCoop();
    const pen = await createHousingUnit(actorOf(coop.member), { name: 'Colony pen 1', kind: 'pen', capacity: null, notes: '' });
    const inPen = await grownLitterAs(coop.member, 50, 6);
    const elsewhere = await grownLitterAs(coop.member, 50, 6);
    const penned = await groupAs(coop.member, { name: 'Penned', formedOn: daysAgo(10), targetGrams: 2270, housingUnitId: pen.id, litters: [{ litterId: inPen.litter.id, heads: 6 }] });
    const other = await groupAs(coop.member, { name: 'Cage row', formedOn: daysAgo(10), targetGrams: 2270, litters: [{ litterId: elsewhere.litter.id, heads: 6 }] });
    await purchaseAs(coop.member, { boughtOn: daysAgo(20), productName: 'Grower', bagGrams: BAG_50_LB, bags: 1, priceCents: 2000 });
    const res = await (await agentOf(coop.member.email)).post('/api/feed/uses').send({ givenOn: daysAgo(1), fromOn: daysAgo(7), grams: 4200, productName: 'Grower', target: 'pen', housingUnitId: pen.id, allocation: 'head_days' });
    expect(res.status).toBe(201);
    const use = (res.body as FeedOverviewDto).uses[0]!;
    expect(use).toMatchObject({ target: 'pen', targetLabel: 'Colony pen 1', allocation: 'head_days', shares: [{ groupId: penned.id, litterId: null, label: 'Penned', grams: 4200 }] });
    const other_ = await asTenant(coop.id, async (c) => (await c.query('SELECT count(*)::int AS n FROM feed_use_shares WHERE group_id = $1', [other.id])).rows[0].n);
    expect(other_).toBe(0);
  });

  it('when feed is given to a doe nursing a litter, then it counts for that litter from kindling to weaning', async () => {
    const coop = await createTestCoop();
    const { doe, litter } = await grownLitterAs(coop.member, 20, 8);
    await purchaseAs(coop.member, { boughtOn: daysAgo(30), productName: 'Doe ration 18%', bagGrams: BAG_50_LB, bags: 1, priceCents: 2268 });
    await feedAs(coop.member, { givenOn: daysAgo(1), fromOn: daysAgo(14), grams: 9000, productName: 'Doe ration 18%', target: 'doe', doeId: doe.id });
    const byLitter = await withTenant({ coopId: coop.id }, (tx) => doeLitterFeedOfFarm(tx, coop.id, coop.farms[0]!.id));
    // 9,000 g of a 22,680 g bag for 2,268 ¢: 900 ¢.
    expect(byLitter.get(litter.id)).toEqual({ grams: 9000, costCents: 900 });
    expect(await withTenant({ coopId: coop.id }, (tx) => doeLitterFeedOfFarm(tx, coop.id, coop.farms[1]!.id))).toEqual(new Map());
  });

  it('when feed is given before it was bought, more than is left, negative, or a back-dated entry would leave later feed short, then clear errors and nothing written', async () => {
    const coop = await createTestCoop();
    const { big } = await twoGroups(coop);
    await purchaseAs(coop.member, { boughtOn: daysAgo(10), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    await feedAs(coop.member, { givenOn: daysAgo(2), grams: 9000, productName: 'Grower', target: 'group', groupId: big.id });
    const agent = await agentOf(coop.member.email);
    const before = await growOutCounts(coop.id);
    const post = (body: object) => agent.post('/api/feed/uses').send({ productName: 'Grower', target: 'group', groupId: big.id, ...body });

    const early = await post({ givenOn: daysAgo(11), grams: 500 });
    expect(early.status).toBe(400);
    expect(early.body.error.details.givenOn).toEqual([`Feed given on ${daysAgo(11)}, before it was first bought on ${daysAgo(10)}`]);
    const tooMuch = await post({ givenOn: farmToday(), grams: 1500 });
    expect(tooMuch.status).toBe(400);
    // The farm weighs in lb/oz: 1,500 g = 52.91 oz = 3 lb 4.9 oz, 1,000 g = 35.27 oz = 2 lb 3.3 oz (NIST HB44: 1 oz = 28.349523125 g).
    expect(tooMuch.body.error.details.grams).toEqual([`3 lb 4.9 oz given on ${farmToday()}, but only 2 lb 3.3 oz of that feed was left`]);
    const backDated = await post({ givenOn: daysAgo(5), grams: 1500 });
    expect(backDated.status).toBe(400);
    expect(backDated.body.error.details.grams[0]).toMatch(new RegExp(`^That would leave the feed given on ${daysAgo(2)} short`));
    const negative = await post({ givenOn: farmToday(), grams: -20 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details.grams).toEqual(['Enter an amount above zero']);
    const unknown = await post({ givenOn: farmToday(), grams: 100, productName: 'Rabbit muesli' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.productName).toEqual(['No purchase of that feed is recorded: record the purchase first']);
    const noRule = await agent.post('/api/feed/uses').send({ givenOn: farmToday(), grams: 100, productName: 'Grower', target: 'farm' });
    expect(noRule.status).toBe(400);
    expect(noRule.body.error.details.allocation).toEqual(['Choose how to split the feed: by head-days or by live weight']);
    const future = await post({ givenOn: addDays(farmToday(), 1), grams: 100 });
    expect(future.status).toBe(400);
    expect(future.body.error.details.givenOn).toEqual(['Feed given cannot be dated in the future']);
    expect(await growOutCounts(coop.id)).toEqual(before);
  });

  it('when another farm\'s member feeds our group, another co-op reads the book, an apprentice records feed or no one is signed in, then 400, their own empty book, 403 and 401', async () => {
    const coop = await createTestCoop();
    const foreign = await createTestCoop();
    const { big } = await twoGroups(coop);
    await purchaseAs(coop.member, { boughtOn: daysAgo(10), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    await purchaseAs(coop.otherFarmMember, { boughtOn: daysAgo(10), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    const before = await growOutCounts(coop.id);
    const other = await agentOf(coop.otherFarmMember.email);
    const cross = await other.post('/api/feed/uses').send({ givenOn: farmToday(), grams: 100, productName: 'Grower', target: 'group', groupId: big.id });
    expect(cross.status).toBe(400);
    expect(cross.body.error.details.groupId).toEqual(["Choose one of your farm's grow-out groups"]);
    const theirBook = (await other.get('/api/feed')).body as FeedOverviewDto;
    expect(theirBook.purchases).toHaveLength(1);
    expect(theirBook.uses).toEqual([]);
    const outsider = (await (await agentOf(foreign.admin.email)).get('/api/feed')).body as FeedOverviewDto;
    expect(outsider.purchases).toEqual([]);
    const apprentice = await agentOf(coop.apprentice.email);
    expect((await apprentice.post('/api/feed/uses').send({ givenOn: farmToday(), grams: 100, productName: 'Grower', target: 'group', groupId: big.id })).status).toBe(403);
    expect((await apprentice.get('/api/feed')).status).toBe(200);
    const anonymous = agentFor(handle);
    expect((await anonymous.get('/api/feed')).status).toBe(401);
    expect((await anonymous.post('/api/feed/uses').send({})).status).toBe(401);
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('correcting the feed book', () => {
  async function bookWithOneUse(coop: TestCoop) {
    const { big, small } = await twoGroups(coop);
    const bought = await purchaseAs(coop.member, { boughtOn: daysAgo(10), productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    const given = await feedAs(coop.member, { givenOn: daysAgo(2), grams: 4000, purchaseId: bought.purchases[0]!.id, target: 'group', groupId: big.id });
    return { big, small, purchase: given.purchases[0]!, use: given.uses[0]! };
  }

  it('when a purchase price is corrected, then the feed given from it is costed anew; a second edit from the old version is refused (409)', async () => {
    const coop = await createTestCoop();
    const { big, purchase, use } = await bookWithOneUse(coop);
    expect(use.costCents).toBe(400); // 4,000 g of a 10,000 g bag at 1,000 ¢
    const agent = await agentOf(coop.member.email);
    const body = { boughtOn: purchase.boughtOn, productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 2500, crudeProteinPercent: 16 };
    const res = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...body, version: purchase.version });
    expect(res.status).toBe(200);
    const book = res.body as FeedOverviewDto;
    expect(book.purchases[0]).toMatchObject({ id: purchase.id, priceCents: 2500, crudeProteinPercent: 16, version: purchase.version + 1 });
    expect(book.uses[0]!.costCents).toBe(1000); // 4,000 g × 2,500 ¢ ÷ 10,000 g
    const group = (await agent.get(`/api/grow-out/groups/${big.id}`)).body as GrowOutGroupDto;
    expect(group.feed).toMatchObject({ feedGrams: 4000, feedCostCents: 1000 });
    // The price corrected away is kept in the record's history.
    const history = await asTenant(coop.id, async (c) => (await c.query(`SELECT changes, actor_user_id FROM record_changes WHERE record_id = $1`, [purchase.id])).rows);
    expect(history).toEqual([{ changes: { priceCents: [1000, 2500], crudeProteinPercent: [null, 16] }, actor_user_id: coop.member.id }]);
    const stale = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...body, priceCents: 1, version: purchase.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_version');
    const after = (await agent.get('/api/feed')).body as FeedOverviewDto;
    expect(after.purchases[0]!.priceCents).toBe(2500);
  });

  it('when a correction would leave feed already given uncovered (fewer bags, bought later, renamed), then 400 naming that feed and nothing changes', async () => {
    const coop = await createTestCoop();
    const { purchase } = await bookWithOneUse(coop);
    const agent = await agentOf(coop.member.email);
    const before = await growOutCounts(coop.id);
    const base = { boughtOn: purchase.boughtOn, productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1000, version: purchase.version };
    const less = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...base, bagGrams: 3000 });
    expect(less.status).toBe(400);
    // In the farm's lb/oz: 4,000 g = 141.1 oz, 3,000 g = 105.8 oz (NIST HB44: 1 oz = 28.349523125 g).
    expect(less.body.error.details.grams[0]).toBe(`That would leave the feed given on ${daysAgo(2)} short: 8 lb 13.1 oz given on ${daysAgo(2)}, but only 6 lb 9.8 oz of that feed was left`);
    const later = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...base, boughtOn: daysAgo(1) });
    expect(later.status).toBe(400);
    expect(later.body.error.details.grams).toContain(`The feed given on ${daysAgo(2)} was drawn from this purchase`);
    const renamed = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...base, productName: 'Finisher' });
    expect(renamed.status).toBe(400);
    const future = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ ...base, boughtOn: addDays(farmToday(), 1) });
    expect(future.status).toBe(400);
    expect(future.body.error.details.boughtOn).toEqual(['A purchase cannot be dated in the future']);
    expect(await growOutCounts(coop.id)).toEqual(before);
    const book = (await agent.get('/api/feed')).body as FeedOverviewDto;
    expect(book.purchases[0]).toMatchObject({ bagGrams: 10_000, boughtOn: purchase.boughtOn, productName: 'Grower', version: purchase.version });
  });

  it('when the book already holds feed given beyond its stock (rows written around the service), then a correction or a new entry is judged only on what it changes', async () => {
    const coop = await createTestCoop();
    const { big, purchase } = await bookWithOneUse(coop);
    // 20 kg given on one day from a 10 kg bag: short before any change (e.g. an old import).
    await asTenant(coop.id, (c) => c.query(
      `INSERT INTO feed_uses (coop_id, farm_id, given_on, from_on, grams, feed_key, target, group_id, entered_by) VALUES ($1, $2, $3, $3, 20000, 'grower', 'group', $4, $5)`,
      [coop.id, coop.farms[0]!.id, daysAgo(1), big.id, coop.member.id],
    ));
    const agent = await agentOf(coop.member.email);
    const price = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ boughtOn: purchase.boughtOn, productName: 'Grower', bagGrams: 10_000, bags: 1, priceCents: 1200, version: purchase.version });
    expect(price.status).toBe(200);
    const given = await agent.post('/api/feed/uses').send({ givenOn: farmToday(), grams: 1000, productName: 'Grower', target: 'group', groupId: big.id });
    expect(given.status).toBe(201);
    // What the change itself leaves short is still refused.
    const less = await agent.put(`/api/feed/purchases/${purchase.id}`).send({ boughtOn: purchase.boughtOn, productName: 'Grower', bagGrams: 3000, bags: 1, priceCents: 1200, version: purchase.version + 1 });
    expect(less.status).toBe(400);
    expect(less.body.error.details.grams.length).toBeGreaterThan(0);
  });

  it('when a purchase still feeds a group, then removing it is refused (409); once that feed given is removed, the purchase goes too and both rows are kept as deleted', async () => {
    const coop = await createTestCoop();
    const { big, purchase, use } = await bookWithOneUse(coop);
    const agent = await agentOf(coop.member.email);
    const refused = await agent.delete(`/api/feed/purchases/${purchase.id}?version=${purchase.version}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.details.purchase).toContain(`The feed given on ${daysAgo(2)} was drawn from this purchase`);
    expect(((await agent.get('/api/feed')).body as FeedOverviewDto).purchases).toHaveLength(1);

    const removedUse = await agent.delete(`/api/feed/uses/${use.id}?version=${use.version}`);
    expect(removedUse.status).toBe(200);
    expect((removedUse.body as FeedOverviewDto).uses).toEqual([]);
    expect((removedUse.body as FeedOverviewDto).purchases[0]!.gramsLeft).toBe(10_000);
    const group = (await agent.get(`/api/grow-out/groups/${big.id}`)).body as GrowOutGroupDto;
    expect(group.feed.feedGrams).toBe(0);
    const again = await agent.delete(`/api/feed/uses/${use.id}?version=${use.version}`);
    expect(again.status).toBe(404);

    const removed = await agent.delete(`/api/feed/purchases/${purchase.id}?version=${purchase.version}`);
    expect(removed.status).toBe(200);
    expect((removed.body as FeedOverviewDto).purchases).toEqual([]);
    expect((removed.body as FeedOverviewDto).products).toEqual([]);
    const rows = await asTenant(coop.id, async (c) => (await c.query(
      `SELECT (SELECT count(*)::int FROM feed_purchases WHERE coop_id = $1 AND deleted_at IS NOT NULL) AS purchases,
              (SELECT count(*)::int FROM feed_uses WHERE coop_id = $1 AND deleted_at IS NOT NULL) AS uses`, [coop.id])).rows[0]);
    expect(rows).toEqual({ purchases: 1, uses: 1 });
    const badVersion = await agent.delete(`/api/feed/uses/${use.id}?version=soon`);
    expect(badVersion.status).toBe(400);
  });

  it('when feed given to one group is corrected to the whole farm, then it is split anew over both groups, the old entry is kept as deleted, and a correction past the stock changes nothing', async () => {
    const coop = await createTestCoop();
    const { big, small, use } = await bookWithOneUse(coop);
    const agent = await agentOf(coop.member.email);
    const res = await agent.put(`/api/feed/uses/${use.id}`).send({ givenOn: daysAgo(2), fromOn: daysAgo(2), grams: 3000, productName: 'Grower', target: 'farm', allocation: 'head_days', version: use.version });
    expect(res.status).toBe(200);
    const book = res.body as FeedOverviewDto;
    expect(book.uses).toHaveLength(1);
    const corrected = book.uses[0]!;
    expect(corrected.id).not.toBe(use.id);
    // One day, 8 heads and 4 heads: 3,000 g by head-days is 2,000 g and 1,000 g.
    expect(Object.fromEntries(corrected.shares.map((s) => [s.groupId, s.grams]))).toEqual({ [big.id]: 2000, [small.id]: 1000 });
    expect(corrected.costCents).toBe(300);
    const bigAfter = (await agent.get(`/api/grow-out/groups/${big.id}`)).body as GrowOutGroupDto;
    expect(bigAfter.feed.feedGrams).toBe(2000);
    const kept = await asTenant(coop.id, async (c) => (await c.query('SELECT grams, target, deleted_at IS NOT NULL AS deleted FROM feed_uses WHERE id = $1', [use.id])).rows[0]);
    expect(kept).toEqual({ grams: 4000, target: 'group', deleted: true });

    const before = await growOutCounts(coop.id);
    const tooMuch = await agent.put(`/api/feed/uses/${corrected.id}`).send({ givenOn: daysAgo(2), grams: 12_000, productName: 'Grower', target: 'group', groupId: big.id, version: corrected.version });
    expect(tooMuch.status).toBe(400);
    // 12,000 g = 423.3 oz and 10,000 g = 352.7 oz: over 10 lb, whole ounces (NIST HB44: 1 oz = 28.349523125 g).
    expect(tooMuch.body.error.details.grams).toEqual([`26 lb 7 oz given on ${daysAgo(2)}, but only 22 lb 1 oz of that feed was left`]);
    expect(await growOutCounts(coop.id)).toEqual(before);
    expect(((await agent.get('/api/feed')).body as FeedOverviewDto).uses[0]!.id).toBe(corrected.id);
  });
});
