import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServiceDto, ServiceListDto } from '@burrowline/shared';
import { almanacCounts, breedingPair, daysAgo, palpationAs, serviceAs } from '../support/almanac';
import { createTestCoop, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { addAnimalAs } from '../support/herd';
import { ROOMY_SIGN_IN, signedInAgent, testApp, type Agent } from '../support/test-app';

const handle = testApp({ signIn: ROOMY_SIGN_IN });
afterAll(async () => {
  await handle.close();
});

const ids = (body: ServiceListDto) => body.items.map((s) => s.id);
const list = async (agent: Agent, query: Record<string, string | number> = {}) => {
  const res = await agent.get('/api/services').query(query);
  expect(res.status).toBe(200);
  return res.body as ServiceListDto;
};

describe('the services list pages in the database', () => {
  let coop: TestCoop;
  let member: Agent;
  /** In the order they were entered; pairs of them share a service date, so the entry order breaks the tie. */
  const services: ServiceDto[] = [];
  let emptied: ServiceDto;

  beforeAll(async () => {
    coop = await createTestCoop();
    const buck = await addAnimalAs(coop.member, { sex: 'buck', birthDate: '2022-11-02' });
    for (let i = 0; i < 11; i += 1) {
      const doe = await addAnimalAs(coop.member, { sex: 'doe', birthDate: '2023-01-10' });
      services.push(await serviceAs(coop.member, { doeId: doe.id, buckId: buck.id, servicedOn: daysAgo(30 - Math.floor(i / 2)) }));
    }
    emptied = services[0]!;
    await palpationAs(coop.member, emptied.id, daysAgo(16), 'negative');
    const neighbours = await breedingPair(coop.otherFarmMember);
    await serviceAs(coop.otherFarmMember, { doeId: neighbours.doe.id, buckId: neighbours.buck.id, servicedOn: daysAgo(2) });
    member = await signedInAgent(coop.member.email, TEST_PASSWORD, handle);
  });

  it('when the services are paged either way, then each page follows the service date, then the entry order, and the total is all of them', async () => {
    const newestFirst = [...services].reverse().map((s) => s.id);
    const one = await list(member, { pageSize: 10 });
    const two = await list(member, { pageSize: 10, page: 2 });
    expect({ one: one.total, two: two.total }).toEqual({ one: 11, two: 11 });
    expect([...ids(one), ...ids(two)]).toEqual(newestFirst);
    const up = [...ids(await list(member, { dir: 'asc', pageSize: 10 })), ...ids(await list(member, { dir: 'asc', pageSize: 10, page: 2 }))];
    expect(up).toEqual(services.map((s) => s.id));
  });

  it('when filtered by state or doe, then only those services come back, counted', async () => {
    const open = await list(member, { status: 'open', pageSize: 50 });
    expect({ total: open.total, ids: ids(open) }).toEqual({ total: 10, ids: services.slice(1).reverse().map((s) => s.id) });
    const closed = await list(member, { status: 'closed' });
    expect({ total: closed.total, ids: ids(closed), status: closed.items[0]!.status }).toEqual({ total: 1, ids: [emptied.id], status: 'empty' });
    const ofDoe = await list(member, { doeId: services[5]!.doe.id });
    expect({ total: ofDoe.total, ids: ids(ofDoe) }).toEqual({ total: 1, ids: [services[5]!.id] });
  });

  it('when the neighbour lists services, then this farm\'s never show', async () => {
    const neighbour = await list(await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle), { pageSize: 50 });
    expect(neighbour.total).toBe(1);
    const ours = new Set(services.map((s) => s.id));
    expect(ids(neighbour).some((id) => ours.has(id))).toBe(false);
    // Naming our doe does not reach across farms either.
    expect((await list(await signedInAgent(coop.otherFarmMember.email, TEST_PASSWORD, handle), { doeId: services[5]!.doe.id })).total).toBe(0);
  });

  it('when the query is malformed, then it is a 400 naming each bad field, and nothing is written', async () => {
    const before = await almanacCounts(coop.id);
    const cases: [Record<string, string | number>, string[]][] = [
      [{ page: 0 }, ['page']],
      [{ pageSize: 500 }, ['pageSize']],
      [{ sort: 'doe', dir: 'down' }, ['sort', 'dir']],
      [{ status: 'kindled' }, ['status']],
      [{ doeId: 'her' }, ['doeId']],
    ];
    for (const [query, fields] of cases) {
      const res = await member.get('/api/services').query(query);
      expect({ query, status: res.status }).toEqual({ query, status: 400 });
      expect(Object.keys(res.body.error.details).sort()).toEqual(fields.sort());
    }
    expect((await member.get('/api/services').query({ limit: 1 })).status).toBe(400);
    expect(await almanacCounts(coop.id)).toEqual(before);
  });
});
