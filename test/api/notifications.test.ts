import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { CSRF_HEADER, RealtimeEvent, type NotificationListDto } from '@burrowline/shared';
import { withTenant } from '../../packages/server/src/db/tenant';
import { notify, type NotificationInput } from '../../packages/server/src/modules/notifications/notifications.service';
import { asTenant } from '../support/db';
import { createTestCoop, createTestMember, TEST_PASSWORD, type TestCoop } from '../support/factories';
import { deliveredMailsTo, queuedMailTo, waitForMail } from '../support/mail';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';

const server = liveTestServer({ signIn: ROOMY_SIGN_IN });

async function agentOf(email: string) {
  const agent = supertest.agent(server.url).set(CSRF_HEADER, '1');
  expect((await agent.post('/api/session').send({ email, password: TEST_PASSWORD })).status).toBe(200);
  return agent;
}

function requestFor(coop: TestCoop, overrides: Partial<NotificationInput> = {}): NotificationInput {
  return {
    coopId: coop.id,
    farmIds: [coop.farms[0]!.id],
    kind: 'stud.requested',
    title: 'Wren Hollow asks for Bramble, 3–17 March',
    link: '/stud-share/loans/1',
    mail: { subject: 'A request for Bramble', text: 'Wren Hollow asks for Bramble from 3 to 17 March.\n\nAnswer it in Burrowline.' },
    key: `test:${crypto.randomUUID()}`,
    ...overrides,
  };
}

const send = (coop: TestCoop, input: NotificationInput) => withTenant({ coopId: coop.id }, (tx) => notify(tx, input));
const bell = async (email: string) => (await (await agentOf(email)).get('/api/notifications')).body as NotificationListDto;

describe('the notification centre', () => {
  it('when a farm is told, then its members have it in the bell and by e-mail, live; its apprentice, the other farm and another co-op nothing', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const member = await server.kit.listen(coop.member.email);
    const otherFarm = await server.kit.listen(coop.otherFarmMember.email);
    const apprentice = await server.kit.listen(coop.apprentice.email);
    const foreign = await server.kit.listen(other.member.email);

    const input = requestFor(coop, { exceptUserId: coop.admin.id });
    await send(coop, input);

    for (const [who, person] of [[member, coop.member], [otherFarm, coop.otherFarmMember], [apprentice, coop.apprentice], [foreign, other.member]] as const) {
      await heardEverythingSoFar(who.socket, person.id);
    }
    expect(member.heard.get(RealtimeEvent.notificationsChanged)).toEqual([{ unread: 1, title: input.title, link: input.link }]);
    expect(otherFarm.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();
    expect(apprentice.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();
    expect(foreign.heard.get(RealtimeEvent.notificationsChanged)).toBeUndefined();

    const list = await bell(coop.member.email);
    expect(list).toMatchObject({ total: 1, unread: 1, page: 1 });
    expect(list.items[0]).toMatchObject({ kind: 'stud.requested', title: input.title, link: input.link, readAt: null });
    // The actor (here the admin, a member of the same farm) is not told of their own action.
    expect((await bell(coop.admin.email)).total).toBe(0);
    expect((await bell(coop.apprentice.email)).total).toBe(0);
    expect((await bell(coop.otherFarmMember.email)).total).toBe(0);
    expect((await bell(other.member.email)).total).toBe(0);

    const mail = await waitForMail(coop.member.email, { subject: /A request for Bramble/ });
    expect(mail.text).toContain('Wren Hollow asks for Bramble from 3 to 17 March.');
    expect(mail.text).toMatch(/http:\/\/127\.0\.0\.1:\d+\/stud-share\/loans\/1/);
    expect(await queuedMailTo(coop.apprentice.email)).toEqual([]);
    expect(await queuedMailTo(coop.otherFarmMember.email)).toEqual([]);
  });

  it('when the same event is told twice (a retry), then each person has it once and one e-mail', async () => {
    const coop = await createTestCoop();
    const input = requestFor(coop, { userIds: [coop.otherFarmMember.id], farmIds: [] });
    await send(coop, input);
    await send(coop, input);
    expect((await bell(coop.otherFarmMember.email)).total).toBe(1);
    expect(await deliveredMailsTo(coop.otherFarmMember.email)).toHaveLength(1);
  });

  it('when apprentices are included, then the farm\'s apprentice is told too', async () => {
    const coop = await createTestCoop();
    await send(coop, requestFor(coop, { apprentices: true, kind: 'day.scheduled', mail: undefined }));
    expect((await bell(coop.apprentice.email)).total).toBe(1);
    expect((await bell(coop.member.email)).total).toBe(1);
  });

  it('when a person reads one or all, then the count falls, on their other screens too, and another person\'s notification is not found', async () => {
    const coop = await createTestCoop();
    for (let i = 0; i < 3; i += 1) await send(coop, requestFor(coop, { userIds: [coop.member.id], farmIds: [], mail: undefined, title: `News ${i}` }));
    const agent = await agentOf(coop.member.email);
    const list = (await agent.get('/api/notifications?pageSize=10')).body as NotificationListDto;
    expect(list.items.map((n) => n.title)).toEqual(['News 2', 'News 1', 'News 0']);
    const screen = await server.kit.listen(coop.member.email);
    await heardEverythingSoFar(screen.socket, coop.member.id);

    const read = await agent.post(`/api/notifications/${list.items[1]!.id}/read`);
    expect(read.status).toBe(200);
    expect(read.body.readAt).not.toBeNull();
    expect((await agent.get('/api/notifications/unread')).body).toEqual({ unread: 2 });
    await heardEverythingSoFar(screen.socket, coop.member.id);
    expect(screen.heard.get(RealtimeEvent.notificationsChanged)).toContainEqual({ unread: 2, title: null, link: null });
    expect(((await agent.get('/api/notifications?unread=true')).body as NotificationListDto).items.map((n) => n.title)).toEqual(['News 2', 'News 0']);

    const stranger = await agentOf(coop.otherFarmMember.email);
    const refused = await stranger.post(`/api/notifications/${list.items[0]!.id}/read`);
    expect(refused.status).toBe(404);
    expect(refused.body.error.message).toBe('That notification was not found');

    expect((await agent.post('/api/notifications/read')).body).toEqual({ unread: 0, marked: 2 });
    expect((await agent.get('/api/notifications/unread')).body).toEqual({ unread: 0 });
  });

  it('when a person pages through many, then each page is the next newest and the total stays', async () => {
    const coop = await createTestCoop();
    for (let i = 0; i < 12; i += 1) await send(coop, requestFor(coop, { userIds: [coop.member.id], farmIds: [], mail: undefined, title: `Item ${String(i).padStart(2, '0')}` }));
    const agent = await agentOf(coop.member.email);
    const second = (await agent.get('/api/notifications?page=2&pageSize=10')).body as NotificationListDto;
    expect(second).toMatchObject({ total: 12, unread: 12, page: 2, pageSize: 10 });
    expect(second.items.map((n) => n.title)).toEqual(['Item 01', 'Item 00']);
    expect((await agent.get('/api/notifications?pageSize=7')).status).toBe(400);
  });

  it('when a person chooses "never" or the morning e-mail for a kind, then no e-mail goes at once, and the choice is theirs alone', async () => {
    const coop = await createTestCoop();
    const second = await createTestMember(coop, { farmIndex: 0 });
    const agent = await agentOf(coop.member.email);
    const before = (await agent.get('/api/notifications/preferences')).body;
    expect(before.preferences.find((p: { kind: string }) => p.kind === 'stud.requested')).toMatchObject({ delivery: 'immediately', defaultDelivery: 'immediately', area: 'Stud Share' });
    expect(before.morningEmailOn).toBe(false);
    const saved = await agent.put('/api/notifications/preferences').send({ preferences: [{ kind: 'stud.requested', delivery: 'never' }, { kind: 'stud.answered', delivery: 'digest' }] });
    expect(saved.status).toBe(200);
    expect(saved.body.preferences.find((p: { kind: string }) => p.kind === 'stud.requested').delivery).toBe('never');
    const bad = await agent.put('/api/notifications/preferences').send({ preferences: [{ kind: 'stud.requested', delivery: 'hourly' }] });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error)).toContain('Choose at once, the morning e-mail, or never');

    await send(coop, requestFor(coop));
    // The second member kept the default: their e-mail arrives; by then the first member's would have been queued with it.
    await waitForMail(second.email, { subject: /A request for Bramble/ });
    expect(await queuedMailTo(coop.member.email)).toEqual([]);
    expect((await bell(coop.member.email)).total).toBe(1);
    const stored = await asTenant(coop.id, async (c) => (await c.query('SELECT user_id, delivery FROM notifications ORDER BY delivery')).rows);
    expect(stored).toEqual(expect.arrayContaining([{ user_id: coop.member.id, delivery: 'never' }, { user_id: second.id, delivery: 'immediately' }]));
  });
});
