import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FeedOverviewDto } from '@burrowline/shared';
import { daysAgo } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { feedAs, growOutCounts, purchaseAs } from '../support/grow-out';
import { asTenant } from '../support/db';
import { figuresOfBook, type BookPurchase, type BookShare, type BookUse } from '@burrowline/shared';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
afterAll(async () => {
  await handle.close();
});

const book = async (agent: Agent, query: Record<string, string | number> = {}) => {
  const res = await agent.get('/api/feed').query(query);
  expect(res.status).toBe(200);
  return res.body as FeedOverviewDto;
};

describe('the feed book pages the feed given', () => {
  let coop: TestCoop;
  let member: Agent;
  /** The days the 25 entries were given, oldest first. */
  const givenOn: string[] = [];

  beforeAll(async () => {
    coop = await createTestCoop();
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Hazel', birthDate: '2023-01-10' });
    // One bag of 22,680 g for 2,268 cents: every 100 g given costs 10 cents.
    await purchaseAs(coop.member, { boughtOn: daysAgo(40), productName: 'Doe ration', bagGrams: 22_680, bags: 1, priceCents: 2268 });
    for (let i = 0; i < 25; i += 1) {
      givenOn.push(daysAgo(30 - i));
      await feedAs(coop.member, { givenOn: daysAgo(30 - i), grams: 100 + i, productName: 'Doe ration', target: 'doe', doeId: doe.id });
    }
    await purchaseAs(coop.otherFarmMember, { boughtOn: daysAgo(5), productName: 'Neighbour pellets', bagGrams: 20_000, bags: 1, priceCents: 1500 });
    member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
  });

  it('when the book is opened, then the latest twenty entries come first and the rest on the next page, with the stock from all of them', async () => {
    const first = await book(member);
    expect({ total: first.usesTotal, page: first.usesPage, size: first.usesPageSize, shown: first.uses.length }).toEqual({ total: 25, page: 1, size: 20, shown: 20 });
    const second = await book(member, { page: 2 });
    expect(second.uses.length).toBe(5);
    expect([...first.uses, ...second.uses].map((u) => u.givenOn)).toEqual([...givenOn].reverse());
    expect([...first.uses, ...second.uses].map((u) => u.grams)).toEqual(Array.from({ length: 25 }, (_, i) => 124 - i));
    // 25 entries of 100 to 124 g: 2,800 g given, 19,880 g left, whichever page is shown.
    expect(second.products).toEqual([{ name: 'Doe ration', gramsLeft: 19_880 }]);
    expect(second.purchases[0]).toMatchObject({ gramsLeft: 19_880 });
    // First in, first out at 0.1 cent a gram: the oldest entry (100 g) cost 10 cents, the latest (124 g) 12.
    expect({ oldest: second.uses.at(-1)!.costCents, latest: first.uses[0]!.costCents }).toEqual({ oldest: 10, latest: 12 });
    const wide = await book(member, { pageSize: 50 });
    expect(wide.uses.map((u) => u.id)).toEqual([...first.uses, ...second.uses].map((u) => u.id));
    const past = await book(member, { page: 4, pageSize: 10 });
    expect({ uses: past.uses, total: past.usesTotal }).toEqual({ uses: [], total: 25 });
  });

  it('when the neighbour opens its book, then none of this farm\'s feed is in it', async () => {
    const theirs = await book(await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle), { pageSize: 50 });
    expect({ total: theirs.usesTotal, uses: theirs.uses, products: theirs.products }).toEqual({ total: 0, uses: [], products: [{ name: 'Neighbour pellets', gramsLeft: 20_000 }] });
  });

  it('when the page asked for is malformed, then it is a 400 naming it, and nothing is written', async () => {
    const before = await growOutCounts(coop.id);
    for (const [query, field] of [[{ page: 0 }, 'page'], [{ pageSize: 25 }, 'pageSize'], [{ page: 'last' }, 'page']] as const) {
      const res = await member.get('/api/feed').query(query);
      expect({ query, status: res.status, fields: Object.keys(res.body.error?.details ?? {}) }).toEqual({ query, status: 400, fields: [field] });
    }
    expect((await member.get('/api/feed').query({ sort: 'grams' })).status).toBe(400);
    expect(await growOutCounts(coop.id)).toEqual(before);
  });
});

describe('the feed book keeps its worked figures beside its rows', () => {
  /** The stored figures of a farm's book, and the same worked anew from its rows. */
  async function storedAndWorked(coopId: string, farmId: string) {
    return asTenant(coopId, async (c) => {
      const purchases = (await c.query(
        `SELECT id, product_name AS "productName", bought_on::text AS "boughtOn", bag_grams AS "bagGrams", bags, price_cents::int AS "priceCents", grams_left::int AS "gramsLeft"
         FROM feed_purchases WHERE farm_id = $1 AND deleted_at IS NULL`, [farmId])).rows as (BookPurchase & { gramsLeft: number })[];
      const uses = (await c.query(
        `SELECT id, feed_key AS "feedKey", given_on::text AS "givenOn", grams, cost_cents::int AS "costCents" FROM feed_uses WHERE farm_id = $1 AND deleted_at IS NULL`, [farmId])).rows as (BookUse & { costCents: number | null })[];
      const shares = (await c.query(
        `SELECT s.id::text AS id, s.feed_use_id AS "feedUseId", s.grams, s.cost_cents::int AS "costCents" FROM feed_use_shares s JOIN feed_uses u ON u.id = s.feed_use_id
         WHERE u.farm_id = $1 AND u.deleted_at IS NULL ORDER BY s.id`, [farmId])).rows as (BookShare & { costCents: number })[];
      const worked = figuresOfBook(purchases, uses, shares);
      return {
        stored: { left: purchases.map((p) => [p.id, p.gramsLeft]), costs: uses.map((u) => [u.id, u.costCents]), shares: shares.map((s) => [s.id, s.costCents]) },
        worked: {
          left: purchases.map((p) => [p.id, worked.gramsLeftByPurchase.get(p.id)]), costs: uses.map((u) => [u.id, worked.costByUse.get(u.id)]),
          shares: shares.map((s) => [s.id, worked.costByShare.get(s.id)]),
        },
        totalCost: uses.reduce((n, u) => n + (u.costCents ?? 0), 0),
      };
    });
  }

  it('when feed is given back-dated, a purchase is corrected and an entry removed, then the stored stock and costs equal the whole book worked anew', async () => {
    const coop = await createTestCoop();
    const farmId = coop.member.farmId!;
    const doe = await addAnimalAs(coop.member, { sex: 'doe', name: 'Clover', birthDate: '2023-02-01' });
    // Two bags at different prices: 10 kg for 1,000 cents (0.1 cent a gram), then 10 kg for 3,000 cents (0.3).
    await purchaseAs(coop.member, { boughtOn: daysAgo(40), productName: 'Doe ration', bagGrams: 10_000, bags: 1, priceCents: 1000 });
    await purchaseAs(coop.member, { boughtOn: daysAgo(20), productName: 'Doe ration', bagGrams: 10_000, bags: 1, priceCents: 3000 });
    await feedAs(coop.member, { givenOn: daysAgo(10), grams: 6000, productName: 'Doe ration', target: 'doe', doeId: doe.id });
    let now = await storedAndWorked(coop.id, farmId);
    expect(now.stored).toEqual(now.worked);
    expect(now.totalCost).toBe(600);
    // 6 kg more given earlier: it takes the cheap bag first, so the later entry now draws 2 kg of the dear one.
    await feedAs(coop.member, { givenOn: daysAgo(15), grams: 6000, productName: 'Doe ration', target: 'doe', doeId: doe.id });
    now = await storedAndWorked(coop.id, farmId);
    expect(now.stored).toEqual(now.worked);
    // 10 kg at 0.1 + 2 kg at 0.3 cents a gram.
    expect(now.totalCost).toBe(1000 + 600);
    const member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    const opened = await book(member);
    const cheap = opened.purchases.find((p) => p.priceCents === 1000)!;
    expect(opened.purchases.map((p) => p.gramsLeft)).toEqual([8000, 0]);
    const corrected = await member.put(`/api/feed/purchases/${cheap.id}`).send({ boughtOn: cheap.boughtOn, productName: 'Doe ration', bagGrams: 10_000, bags: 1, priceCents: 2000, version: cheap.version });
    expect(corrected.status).toBe(200);
    now = await storedAndWorked(coop.id, farmId);
    expect(now.stored).toEqual(now.worked);
    expect(now.totalCost).toBe(2000 + 600);
    const earlier = (corrected.body as FeedOverviewDto).uses.find((u) => u.givenOn === daysAgo(15))!;
    expect((await member.delete(`/api/feed/uses/${earlier.id}?version=${earlier.version}`)).status).toBe(200);
    now = await storedAndWorked(coop.id, farmId);
    expect(now.stored).toEqual(now.worked);
    expect(now.totalCost).toBe(1200);
    expect((await book(member)).products).toEqual([{ name: 'Doe ration', gramsLeft: 14_000 }]);
  });
});
