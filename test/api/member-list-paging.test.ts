import { beforeAll, describe, expect, it } from 'vitest';
import { memberSortKeys, type MemberDto, type MemberListDto, type MemberSortKey } from '@burrowline/shared';
import { asTenant } from '../support/db';
import { createAwaitingMember, createTestCoop, createTestInvitee, createTestMember, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { sharedSignedInAgent, type Agent } from '../support/test-app';

const natural = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
const text = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const shownFarm = (m: MemberDto) => m.farm?.name ?? m.invitation?.farmName ?? '';

/** The documented order of each sort: its key, then the name, then the id, all in the chosen direction. */
const byKey: Record<MemberSortKey, (a: MemberDto, b: MemberDto) => number> = {
  name: () => 0,
  role: (a, b) => text(a.role, b.role),
  farm: (a, b) => natural.compare(shownFarm(a), shownFarm(b)),
  status: (a, b) => text(a.status, b.status),
  // Never signed in sorts as the earliest.
  lastSignInAt: (a, b) => text(a.lastSignInAt ?? '', b.lastSignInAt ?? ''),
  joinedAt: (a, b) => new Date(a.joinedAt).getTime() - new Date(b.joinedAt).getTime(),
};
const expectedOrder = (people: MemberDto[], sort: MemberSortKey, dir: 'asc' | 'desc') =>
  [...people].sort((a, b) => (dir === 'asc' ? 1 : -1) * (byKey[sort](a, b) || natural.compare(a.name, b.name) || text(a.id, b.id))).map((m) => m.id);

const list = async (agent: Agent, query: Record<string, string | number> = {}) => {
  const res = await agent.get('/api/members').query(query);
  expect(res.status).toBe(200);
  return res.body as MemberListDto;
};
const ids = (body: MemberListDto) => body.items.map((m) => m.id);

describe('the roster pages in the database', () => {
  let coop: TestCoop;
  let admin: Agent;
  let everyone: MemberDto[];
  let invitee: { id: string };
  let awaiting: { id: string };
  let foreignName: string;

  beforeAll(async () => {
    coop = await createTestCoop();
    for (let i = 0; i < 7; i += 1) await createTestMember(coop, { farmIndex: i % 2 });
    invitee = await createTestInvitee(coop);
    awaiting = await createAwaitingMember(coop);
    const foreign = await createTestCoop();
    foreignName = (await createTestMember(foreign)).name;
    admin = await sharedSignedInAgent(coop.admin.email, TEST_PASSWORD);
    await sharedSignedInAgent(coop.member.email, TEST_PASSWORD); // a sign-in for the last-sign-in sort
    const disabled = await admin.post(`/api/members/${coop.otherFarmMember.id}/disable`).send({ reason: 'Left the co-op this spring', version: 0 });
    expect(disabled.status).toBe(200);
    everyone = (await list(admin, { pageSize: 50 })).items;
  });

  it('when the admin opens the roster, then it is everyone of the co-op, twenty a page by name, with the total', async () => {
    expect(everyone.length).toBe(13);
    const first = await list(admin);
    expect({ total: first.total, page: first.page, pageSize: first.pageSize }).toEqual({ total: 13, page: 1, pageSize: 20 });
    expect(ids(first)).toEqual(expectedOrder(everyone, 'name', 'asc'));
    const statuses = new Map(everyone.map((m) => [m.id, m.status]));
    expect([statuses.get(invitee.id), statuses.get(awaiting.id), statuses.get(coop.otherFarmMember.id)]).toEqual(['invited', 'awaiting_password', 'disabled']);
  });

  it.each(memberSortKeys.flatMap((sort) => (['asc', 'desc'] as const).map((dir) => [sort, dir] as const)))(
    'when sorted by %s %s, then both pages follow the key, ties broken by name',
    async (sort, dir) => {
      const one = await list(admin, { sort, dir, pageSize: 10 });
      const two = await list(admin, { sort, dir, pageSize: 10, page: 2 });
      expect({ one: one.items.length, two: two.items.length, total: two.total }).toEqual({ one: 10, two: 3, total: 13 });
      expect([...ids(one), ...ids(two)]).toEqual(expectedOrder(everyone, sort, dir));
    },
  );

  it('when filtered by role, status or a search, then only those people come back, counted', async () => {
    const apprentices = await list(admin, { role: 'apprentice' });
    expect({ total: apprentices.total, ids: ids(apprentices) }).toEqual({ total: 1, ids: [coop.apprentice.id] });
    const invited = await list(admin, { status: 'invited' });
    expect({ total: invited.total, ids: ids(invited) }).toEqual({ total: 1, ids: [invitee.id] });
    const byEmail = await list(admin, { q: coop.member.email.toUpperCase() });
    expect(ids(byEmail)).toEqual([coop.member.id]);
    const byFarm = await list(admin, { q: coop.farms[1]!.name, pageSize: 50 });
    expect(ids(byFarm).sort()).toEqual(everyone.filter((m) => m.farm?.id === coop.farms[1]!.id).map((m) => m.id).sort());
    expect((await list(admin, { q: '%' })).total).toBe(0); // a wildcard is a character, not a pattern
    const past = await list(admin, { page: 3, pageSize: 10 });
    expect({ items: past.items, total: past.total }).toEqual({ items: [], total: 13 });
  });

  it('when the search names someone of another co-op, then nobody comes back', async () => {
    const found = await list(admin, { q: foreignName });
    expect({ items: found.items, total: found.total }).toEqual({ items: [], total: 0 });
  });

  it('when the query is malformed, then it is a 400 naming each bad field, and nothing changes', async () => {
    const before = await asTenant(coop.id, async (c) => (await c.query('SELECT id, role, version, disabled_at FROM users ORDER BY id')).rows);
    const cases: [Record<string, string | number>, string[]][] = [
      [{ page: 0 }, ['page']],
      [{ pageSize: 15 }, ['pageSize']],
      [{ sort: 'email', dir: 'up' }, ['sort', 'dir']],
      [{ role: 'owner', status: 'gone' }, ['role', 'status']],
    ];
    for (const [query, fields] of cases) {
      const res = await admin.get('/api/members').query(query);
      expect({ query, status: res.status }).toEqual({ query, status: 400 });
      expect(Object.keys(res.body.error.details).sort()).toEqual(fields.sort());
    }
    expect((await admin.get('/api/members').query({ coopId: coop.id })).status).toBe(400);
    const after = await asTenant(coop.id, async (c) => (await c.query('SELECT id, role, version, disabled_at FROM users ORDER BY id')).rows);
    expect(after).toEqual(before);
  });
});
