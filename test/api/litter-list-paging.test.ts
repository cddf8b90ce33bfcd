import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LitterDto, LitterListDto } from '@burrowline/shared';
import { almanacCounts, daysAgo, farmToday, litterAs } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { ROOMY_SIGN_IN, signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
afterAll(async () => {
  await handle.close();
});

const list = async (agent: Agent, query: Record<string, string | number> = {}) => {
  const res = await agent.get('/api/litters').query(query);
  expect(res.status).toBe(200);
  return res.body as LitterListDto;
};

describe('the litters list pages in the database', () => {
  let coop: TestCoop;
  let member: Agent;
  /** Eleven litters, kindled 1 to 11 days apart; kits born alive 4, 5, 6, 4, 5, 6… so ties need the tie-break. */
  const litters: LitterDto[] = [];
  let weaned: LitterDto;

  beforeAll(async () => {
    coop = await createTestCoop();
    for (let i = 0; i < 11; i += 1) {
      const kindledDaysAgo = 45 - i * 3;
      const { litter } = await litterAs(coop.member, { servicedDaysAgo: kindledDaysAgo + 31, kindledDaysAgo, bornAlive: 4 + (i % 3), doe: `Doe ${i}` });
      litters.push(litter);
    }
    member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    weaned = litters[0]!;
    const weaning = await member.post(`/api/litters/${weaned.id}/events`).send({ kind: 'weaned', on: daysAgo(1), count: weaned.bornAlive, confirm: true });
    expect(weaning.status).toBe(201);
    // The neighbour's litter and another co-op's never show on this farm's list.
    await litterAs(coop.otherFarmMember, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 7 });
    const other = await createTestCoop();
    await litterAs(other.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 7 });
  });

  it('when the litters are listed, then the latest kindling comes first, ten a page, with the total and each state\'s count', async () => {
    const first = await list(member);
    expect(first).toMatchObject({ total: 11, page: 1, pageSize: 20, counts: { nursing: 10, weaned: 1, all: 11 } });
    expect(first.items.map((l) => l.id)).toEqual([...litters].reverse().map((l) => l.id));
    const pageOne = await list(member, { pageSize: 10 });
    const pageTwo = await list(member, { pageSize: 10, page: 2 });
    expect([...pageOne.items, ...pageTwo.items].map((l) => l.id)).toEqual(first.items.map((l) => l.id));
    expect({ one: pageOne.items.length, two: pageTwo.items.length, total: pageTwo.total }).toEqual({ one: 10, two: 1, total: 11 });
    expect(pageTwo.items[0]).toMatchObject({ id: weaned.id, status: 'weaned', onDoe: 0, weaned: weaned.bornAlive });
    expect(first.items[0]).toMatchObject({ status: 'nursing', onDoe: litters[10]!.bornAlive, ageDays: 15 });
  });

  it.each([
    ['kindledOn', 'asc'],
    ['kindledOn', 'desc'],
    ['bornAlive', 'asc'],
    ['bornAlive', 'desc'],
  ] as const)('when sorted by %s %s, then the pages follow it, ties broken by kindling date', async (sort, dir) => {
    const sign = dir === 'asc' ? 1 : -1;
    const expected = [...litters]
      .sort((a, b) => sign * ((sort === 'bornAlive' ? a.bornAlive - b.bornAlive : 0) || a.kindledOn.localeCompare(b.kindledOn)))
      .map((l) => l.id);
    const pageOne = await list(member, { sort, dir, pageSize: 10 });
    const pageTwo = await list(member, { sort, dir, pageSize: 10, page: 2 });
    expect([...pageOne.items, ...pageTwo.items].map((l) => l.id)).toEqual(expected);
  });

  it('when filtered by state, then only those litters come back and the total counts them', async () => {
    const nursing = await list(member, { status: 'nursing' });
    expect({ total: nursing.total, ids: nursing.items.map((l) => l.id) }).toEqual({ total: 10, ids: litters.slice(1).reverse().map((l) => l.id) });
    const done = await list(member, { status: 'weaned' });
    expect({ total: done.total, ids: done.items.map((l) => l.id) }).toEqual({ total: 1, ids: [weaned.id] });
    const past = await list(member, { status: 'weaned', page: 2, pageSize: 10 });
    expect({ items: past.items, total: past.total }).toEqual({ items: [], total: 1 });
  });

  it('when filtered by one dam, then only her litters come back, with the counts of hers alone', async () => {
    const dam = litters[4]!.dam.id;
    const hers = await list(member, { damId: dam });
    expect({ total: hers.total, ids: hers.items.map((l) => l.id), counts: hers.counts }).toEqual({ total: 1, ids: [litters[4]!.id], counts: { nursing: 1, weaned: 0, all: 1 } });
    const bad = await member.get('/api/litters').query({ damId: 'not-a-dam' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details)).toEqual(['damId']);
  });

  it('when the neighbour or another co-op lists litters, then none of this farm\'s show', async () => {
    const neighbour = await list(await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle));
    expect(neighbour.total).toBe(1);
    expect(neighbour.items.map((l) => l.farmId)).toEqual([coop.farms[1]!.id]);
    const ours = new Set(litters.map((l) => l.id));
    expect(neighbour.items.some((l) => ours.has(l.id))).toBe(false);
  });

  it('when the query is malformed, then it is a 400 naming each bad field, and nothing is written', async () => {
    const before = await almanacCounts(coop.id);
    const cases: [Record<string, string | number>, string[]][] = [
      [{ page: 0 }, ['page']],
      [{ pageSize: 7 }, ['pageSize']],
      [{ sort: 'dam', dir: 'sideways' }, ['sort', 'dir']],
      [{ status: 'sold' }, ['status']],
    ];
    for (const [query, fields] of cases) {
      const res = await member.get('/api/litters').query(query);
      expect({ query, status: res.status }).toEqual({ query, status: 400 });
      expect(Object.keys(res.body.error.details).sort()).toEqual(fields.sort());
    }
    expect((await member.get('/api/litters').query({ limit: 5 })).status).toBe(400);
    expect(await almanacCounts(coop.id)).toEqual(before);
  });
});

describe("the list's nursing and weaned states follow every entry on a litter", () => {
  it('when kits are lost by an unreviewed entry, returned in review, then fostered away, then each litter shows where its kits are, filtered and counted alike', async () => {
    const coop = await createTestCoop();
    const member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
    const apprentice = await signedInAgent(coop.apprentice.email, TEST_PASSWORD, handle);
    const { litter: giving } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 3, doe: 'Giving' });
    const { litter: taking } = await litterAs(coop.member, { servicedDaysAgo: 38, kindledDaysAgo: 7, bornAlive: 5, doe: 'Taking' });
    const shown = async () => {
      const all = await list(member);
      const nursing = await list(member, { status: 'nursing' });
      const weanedOnes = await list(member, { status: 'weaned' });
      return {
        onDoe: Object.fromEntries(all.items.map((l) => [l.id === giving.id ? 'giving' : 'taking', `${l.onDoe} ${l.status}`])),
        nursing: nursing.items.map((l) => l.id),
        weaned: weanedOnes.items.map((l) => l.id),
        counts: all.counts,
      };
    };

    const loss = await apprentice.post(`/api/litters/${giving.id}/events`).send({ kind: 'lost', on: daysAgo(1), count: 3, cause: 'Found dead in the nest' });
    expect(loss.status).toBe(201);
    // An entry waiting for review counts (as unverified) until it is returned.
    expect(await shown()).toEqual({
      onDoe: { giving: '0 weaned', taking: '5 nursing' }, nursing: [taking.id], weaned: [giving.id], counts: { nursing: 1, weaned: 1, all: 2 },
    });

    const returned = await member.post(`/api/litter-events/${loss.body.events[0].id}/review`).send({ decision: 'returned', comment: 'They were asleep', version: 0 });
    expect(returned.status).toBe(200);
    expect(await shown()).toEqual({
      onDoe: { giving: '3 nursing', taking: '5 nursing' }, nursing: [taking.id, giving.id], weaned: [], counts: { nursing: 2, weaned: 0, all: 2 },
    });

    const fostered = await member.post(`/api/litters/${giving.id}/fosterings`).send({ direction: 'out', otherLitterId: taking.id, on: farmToday(), count: 3 });
    expect(fostered.status).toBe(201);
    expect(await shown()).toEqual({
      onDoe: { giving: '0 weaned', taking: '8 nursing' }, nursing: [taking.id], weaned: [giving.id], counts: { nursing: 1, weaned: 1, all: 2 },
    });
  });
});
