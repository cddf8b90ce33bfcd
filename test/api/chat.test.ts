import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { ClientEvent, RealtimeEvent, type ChatMessageDto, type ChatMessagePageDto, type ChatSearchHitDto, type ChatThreadDto, type ChatThreadListDto, type SocketAck } from '@burrowline/shared';
import type { Socket } from 'socket.io-client';
import { litterAs } from '../support/almanac';
import { chatAgent, chatRows, channelOf, fillThread, notificationsOf, say } from '../support/chat';
import { asTenant } from '../support/db';
import { createTestCoop, type TestCoop } from '../support/factories';
import { heardEverythingSoFar, liveTestServer } from '../support/sockets';
import { ROOMY_SIGN_IN } from '../support/test-app';

const RATE = { messages: 6, windowSeconds: 60 };
const server = liveTestServer({ signIn: ROOMY_SIGN_IN, chat: { rateLimit: RATE } });
const agent = (email: string) => chatAgent(server.url, email);

async function litterThread(coop: TestCoop) {
  const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 6 });
  const member = await agent(coop.member.email);
  const res = await member.post(`/api/chat/subjects/litter/${litter.id}/open`);
  expect(res.status).toBe(200);
  return { litter, thread: res.body as ChatThreadDto, member };
}

const join = (socket: Socket, threadId: string) =>
  new Promise<SocketAck>((resolve) => socket.emit(ClientEvent.chatJoin, { threadId }, (ack: SocketAck) => resolve(ack)));

const heardMessages = (heard: Map<string, unknown[]>) => (heard.get(RealtimeEvent.chatMessage) ?? []) as ChatMessageDto[];

describe('Co-op Chat: who reads what', () => {
  it('when a member posts in the channel, then everyone of the co-op reads it (apprentice, admin, other farm) and another co-op does not', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    const sent = await say(member, channel.id, 'Who has spare hay this week?');
    expect(sent).toMatchObject({ body: 'Who has spare hay this week?', state: 'visible', author: { id: coop.member.id, farmId: coop.member.farmId, farmName: coop.farms[0]!.name } });

    for (const person of [coop.apprentice, coop.admin, coop.otherFarmMember]) {
      const a = await agent(person.email);
      const list = (await a.get('/api/chat/threads')).body as ChatThreadListDto;
      expect(list.items[0]).toMatchObject({ id: channel.id, kind: 'channel', unread: 1, lastMessage: { excerpt: 'Who has spare hay this week?' } });
      expect(list.totalUnread).toBe(1);
      const page = (await a.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto;
      expect(page.items.map((m) => m.body)).toEqual(['Who has spare hay this week?']);
    }
    // The author's own message is read already.
    expect((await channelOf(member)).unread).toBe(0);

    const foreign = await agent(other.member.email);
    expect((await foreign.get(`/api/chat/threads/${channel.id}`)).status).toBe(404);
    expect((await foreign.get(`/api/chat/threads/${channel.id}/messages`)).status).toBe(404);
    expect((await foreign.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'hello' })).status).toBe(404);
    expect((await channelOf(foreign)).id).not.toBe(channel.id);
  });

  it('when a litter has a thread, then only its farm reads it (member, apprentice, admin of that farm); the other farm and another co-op get 404 everywhere', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const { litter, thread, member } = await litterThread(coop);
    expect(thread).toMatchObject({ kind: 'subject', subjectType: 'litter', subjectId: litter.id, link: `/litters/${litter.id}` });
    expect(thread.title).toMatch(/^Litter of .+, kindled \d{4}-\d{2}-\d{2}$/);
    await say(member, thread.id, 'Kits look fine, nest box dry');

    for (const person of [coop.apprentice, coop.admin]) {
      const a = await agent(person.email);
      expect((await a.post(`/api/chat/subjects/litter/${litter.id}/open`)).body.id).toBe(thread.id);
      expect(((await a.get(`/api/chat/threads/${thread.id}/messages`)).body as ChatMessagePageDto).items).toHaveLength(1);
      expect(((await a.get('/api/chat/threads')).body as ChatThreadListDto).items.map((t) => t.id)).toContain(thread.id);
    }
    for (const person of [coop.otherFarmMember, other.admin]) {
      const a = await agent(person.email);
      expect((await a.post(`/api/chat/subjects/litter/${litter.id}/open`)).status).toBe(404);
      expect((await a.get(`/api/chat/threads/${thread.id}`)).status).toBe(404);
      expect((await a.get(`/api/chat/threads/${thread.id}/messages`)).status).toBe(404);
      expect((await a.get(`/api/chat/threads/${thread.id}/people`)).status).toBe(404);
      expect((await a.post(`/api/chat/threads/${thread.id}/read`).send({ seq: 1 })).status).toBe(404);
      expect((await a.post(`/api/chat/threads/${thread.id}/messages`).send({ clientId: randomUUID(), body: 'let me in' })).status).toBe(404);
      expect(((await a.get('/api/chat/threads')).body as ChatThreadListDto).items.map((t) => t.id)).not.toContain(thread.id);
    }
    // An unknown kind of subject, or an id that is no litter, is simply not found.
    expect((await member.post(`/api/chat/subjects/loan/${litter.id}/open`)).status).toBe(404);
    expect((await member.post(`/api/chat/subjects/litter/${randomUUID()}/open`)).status).toBe(404);
    expect(await chatRows(coop.id, thread.id)).toHaveLength(1);
  });

  it('when searching, then only threads the person may read are searched (the litter\'s thread is its farm\'s alone)', async () => {
    const coop = await createTestCoop();
    const { thread, member } = await litterThread(coop);
    const channel = await channelOf(member);
    await say(member, thread.id, 'The doe pulled fur early, fennel helps her milk');
    await say(member, channel.id, 'Anyone growing fennel this year?');
    await say(member, channel.id, 'Unrelated chatter about fences');

    const hits = (await member.get('/api/chat/search').query({ q: 'fennel' })).body as ChatSearchHitDto[];
    expect(hits.map((h) => h.threadTitle).sort()).toEqual([channel.title, thread.title].sort());
    expect(hits.find((h) => h.threadTitle === channel.title)!.snippet).toContain('«fennel»');

    const otherFarm = await agent(coop.otherFarmMember.email);
    const theirs = (await otherFarm.get('/api/chat/search').query({ q: 'fennel' })).body as ChatSearchHitDto[];
    expect(theirs.map((h) => h.message.body)).toEqual(['Anyone growing fennel this year?']);
    expect((await otherFarm.get('/api/chat/search').query({ q: 'f' })).status).toBe(400);
  });
});

describe('Co-op Chat: messages', () => {
  it('when the same client id is sent twice, then one message is stored and the retry answers it; other text under that id is a 409', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    const clientId = randomUUID();
    const first = await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId, body: 'Feed order goes in Friday' });
    const retry = await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId, body: 'Feed order goes in Friday' });
    expect(first.status).toBe(201);
    expect(retry.status).toBe(200);
    expect(retry.body.id).toBe(first.body.id);
    expect(retry.body.clientId).toBe(clientId);
    const clash = await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId, body: 'Something else' });
    expect(clash.status).toBe(409);
    expect((await chatRows(coop.id, channel.id)).map((r) => r.body)).toEqual(['Feed order goes in Friday']);
  });

  it('when a message is too long, empty or replies to another thread\'s message, then it is refused and nothing is stored', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    const topic = (await member.post('/api/chat/threads').send({ title: 'Heat this week' })).body as ChatThreadDto;
    const elsewhere = await say(member, topic.id, 'Frozen bottles in every cage');
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'x'.repeat(4001) })).status).toBe(400);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: '   ' })).status).toBe(400);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'Re', replyToId: elsewhere.id })).status).toBe(400);
    expect(await chatRows(coop.id, channel.id)).toEqual([]);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'x'.repeat(4000) })).status).toBe(201);
  });

  it('when someone edits, removes or replies, then only the author edits or removes; a removed message leaves a placeholder the reply still points at', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const otherFarm = await agent(coop.otherFarmMember.email);
    const channel = await channelOf(member);
    const original = await say(member, channel.id, 'Processing day moved to Saturday');
    const reply = await say(otherFarm, channel.id, 'Saturday suits us', { replyToId: original.id });
    expect(reply.replyTo).toEqual({ id: original.id, authorName: coop.member.name, excerpt: 'Processing day moved to Saturday' });

    expect((await otherFarm.patch(`/api/chat/messages/${original.id}`).send({ body: 'hijacked' })).status).toBe(403);
    expect((await otherFarm.delete(`/api/chat/messages/${original.id}`)).status).toBe(403);
    const edited = await member.patch(`/api/chat/messages/${original.id}`).send({ body: 'Processing day moved to Sunday' });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ body: 'Processing day moved to Sunday', state: 'visible' });
    expect(edited.body.editedAt).not.toBeNull();

    const removed = await member.delete(`/api/chat/messages/${original.id}`);
    expect(removed.status).toBe(200);
    expect(removed.body).toMatchObject({ state: 'deleted', body: null });
    const page = ((await otherFarm.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto).items;
    expect(page.map((m) => m.state)).toEqual(['deleted', 'visible']);
    expect(page[1]!.replyTo).toEqual({ id: original.id, authorName: coop.member.name, excerpt: null });
    expect((await member.patch(`/api/chat/messages/${original.id}`).send({ body: 'back' })).status).toBe(409);
    const [row] = await chatRows(coop.id, channel.id);
    expect(row).toMatchObject({ body: '' });
    expect(row!.deleted_at).not.toBeNull();
  });

  it('when the admin hides a message, then a reason is needed, the text is kept for the audit, the author is told and sees why; a member may not hide', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const otherFarm = await agent(coop.otherFarmMember.email);
    const admin = await agent(coop.admin.email);
    const channel = await channelOf(member);
    const message = await say(otherFarm, channel.id, 'Selling kits cheap, DM me, no questions');

    expect((await member.post(`/api/chat/messages/${message.id}/hide`).send({ reason: 'spam' })).status).toBe(403);
    expect((await admin.post(`/api/chat/messages/${message.id}/hide`).send({ reason: '' })).status).toBe(400);
    const hidden = await admin.post(`/api/chat/messages/${message.id}/hide`).send({ reason: 'Sales go on the swap board' });
    expect(hidden.status).toBe(200);
    expect(hidden.body).toMatchObject({ state: 'hidden', body: null, hiddenReason: 'Sales go on the swap board' });

    const seenByAuthor = ((await otherFarm.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto).items[0]!;
    expect(seenByAuthor).toMatchObject({ state: 'hidden', body: null, hiddenReason: 'Sales go on the swap board' });
    const seenByOthers = ((await member.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto).items[0]!;
    expect(seenByOthers).toMatchObject({ state: 'hidden', body: null, hiddenReason: null });
    expect(((await member.get('/api/chat/search').query({ q: 'kits cheap' })).body as unknown[])).toEqual([]);

    const [row] = await chatRows(coop.id, channel.id);
    expect(row).toMatchObject({ body: 'Selling kits cheap, DM me, no questions', hidden_reason: 'Sales go on the swap board' });
    const audit = await asTenant(coop.id, async (c) => (await c.query(`SELECT actor_user_id, details FROM audit_events WHERE action = 'chat_message.hidden' AND subject_id = $1`, [message.id])).rows);
    expect(audit).toEqual([{ actor_user_id: coop.admin.id, details: { reason: 'Sales go on the swap board', authorId: coop.otherFarmMember.id } }]);
    expect((await notificationsOf(coop.id, 'chat.hidden')).map((n) => n.user_id)).toEqual([coop.otherFarmMember.id]);
  });

  it('when someone is mentioned, then only that person is told (by a chat.mention linking to the message); a person who cannot read the thread cannot be mentioned', async () => {
    const coop = await createTestCoop();
    const { thread: litter, member } = await litterThread(coop);
    const channel = await channelOf(member);
    const otherFarmName = coop.otherFarmMember.name;
    const sent = await say(member, channel.id, `@${otherFarmName} can you bring the scale?`, { mentions: [coop.otherFarmMember.id] });
    expect(sent.mentions).toEqual([{ id: coop.otherFarmMember.id, name: otherFarmName }]);
    const told = await notificationsOf(coop.id, 'chat.mention');
    expect(told).toEqual([{ user_id: coop.otherFarmMember.id, title: `${coop.member.name} mentioned you in ${channel.title}`, link: `/chat/${channel.id}?message=${sent.id}` }]);

    // An edit that keeps the mention tells nobody again.
    expect((await member.patch(`/api/chat/messages/${sent.id}`).send({ body: `@${otherFarmName} can you bring the big scale?`, mentions: [coop.otherFarmMember.id] })).status).toBe(200);
    expect(await notificationsOf(coop.id, 'chat.mention')).toHaveLength(1);

    // The litter's thread is farm A's: its apprentice may be mentioned, the other farm may not.
    const refused = await member.post(`/api/chat/threads/${litter.id}/messages`).send({ clientId: randomUUID(), body: `@${otherFarmName} look`, mentions: [coop.otherFarmMember.id] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.details.mentions[0]).toMatch(/cannot read this thread/);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'no name written', mentions: [coop.admin.id] })).status).toBe(400);
    await say(member, litter.id, `@${coop.apprentice.name} please weigh them`, { mentions: [coop.apprentice.id] });
    expect((await notificationsOf(coop.id, 'chat.mention')).map((n) => n.user_id)).toEqual([coop.otherFarmMember.id, coop.apprentice.id]);

    const people = (await member.get(`/api/chat/threads/${litter.id}/people`).query({ q: '' })).body as { id: string }[];
    expect(people.map((p) => p.id).sort()).toEqual([coop.admin.id, coop.apprentice.id].sort());
  });

  it('when someone reacts, then the set is fixed, each person counts once per reaction and may take it back', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const otherFarm = await agent(coop.otherFarmMember.email);
    const channel = await channelOf(member);
    const message = await say(member, channel.id, 'Scale calibrated');
    await otherFarm.put(`/api/chat/messages/${message.id}/reactions/thumbs-up`);
    const twice = await otherFarm.put(`/api/chat/messages/${message.id}/reactions/thumbs-up`);
    expect(twice.body.reactions).toEqual([{ reaction: 'thumbs-up', userIds: [coop.otherFarmMember.id] }]);
    expect((await member.put(`/api/chat/messages/${message.id}/reactions/skull`)).status).toBe(400);
    const back = await otherFarm.delete(`/api/chat/messages/${message.id}/reactions/thumbs-up`);
    expect(back.body.reactions).toEqual([]);
  });

  it(`when a person sends more than ${RATE.messages} messages in ${RATE.windowSeconds} s, then the next is refused with a clear 429 and not stored`, async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    for (let i = 0; i < RATE.messages; i++) await say(member, channel.id, `Quick note ${i}`);
    const refused = await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'one too many' });
    expect(refused.status).toBe(429);
    expect(refused.body.error.message).toMatch(/more than 6 messages in 60 seconds/);
    expect(await chatRows(coop.id, channel.id)).toHaveLength(RATE.messages);
    // Someone else is not held back by it.
    await say(await agent(coop.otherFarmMember.email), channel.id, 'I can still talk');
  });

  it('when a thread has 120 messages, then history pages backwards by seq 50, 50, 20 with nothing twice, and `after` returns only newer ones', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    await fillThread(coop.id, channel.id, coop.otherFarmMember.id, 120);
    const seen: number[] = [];
    let before: number | undefined;
    const sizes: boolean[] = [];
    for (;;) {
      const res = await member.get(`/api/chat/threads/${channel.id}/messages`).query(before === undefined ? {} : { before });
      const page = res.body as ChatMessagePageDto;
      seen.unshift(...page.items.map((m) => m.seq));
      sizes.push(page.hasMore);
      if (!page.hasMore) break;
      before = page.items[0]!.seq;
    }
    expect(sizes).toEqual([true, true, false]);
    expect(seen).toHaveLength(120);
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
    expect(new Set(seen).size).toBe(120);
    const after = (await member.get(`/api/chat/threads/${channel.id}/messages`).query({ after: seen[115] })).body as ChatMessagePageDto;
    expect(after.items.map((m) => m.seq)).toEqual(seen.slice(116));
    expect(after.items.map((m) => m.body)).toEqual(['Message number 117', 'Message number 118', 'Message number 119', 'Message number 120']);
    expect((await member.get(`/api/chat/threads/${channel.id}/messages`).query({ before: 5, after: 1 })).status).toBe(400);
  });

  it('when a person reads up to a message, then the unread count drops, the position never goes back and never past the last message', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const otherFarm = await agent(coop.otherFarmMember.email);
    const channel = await channelOf(member);
    const sent = [];
    for (let i = 0; i < 4; i++) sent.push(await say(otherFarm, channel.id, `Update ${i}`));
    expect((await channelOf(member)).unread).toBe(4);
    const read = await member.post(`/api/chat/threads/${channel.id}/read`).send({ seq: sent[1]!.seq });
    expect(read.body).toMatchObject({ readSeq: sent[1]!.seq, unread: 2 });
    expect((await member.post(`/api/chat/threads/${channel.id}/read`).send({ seq: sent[0]!.seq })).body.readSeq).toBe(sent[1]!.seq);
    expect((await member.post(`/api/chat/threads/${channel.id}/read`).send({ seq: Number.MAX_SAFE_INTEGER })).body).toMatchObject({ readSeq: sent[3]!.seq, unread: 0 });
    expect(((await member.get('/api/chat/threads')).body as ChatThreadListDto).totalUnread).toBe(0);
  });

  it('when the admin mutes a person, then their channel and topic messages are refused until lifted, subject threads stay open; members may not mute', async () => {
    const coop = await createTestCoop();
    const { thread: litter } = await litterThread(coop);
    const member = await agent(coop.member.email);
    const admin = await agent(coop.admin.email);
    const channel = await channelOf(member);
    const topic = (await admin.post('/api/chat/threads').send({ title: 'Show season' })).body as ChatThreadDto;
    expect((await member.post('/api/chat/mutes').send({ userId: coop.otherFarmMember.id, minutes: 60, reason: 'Cool off' })).status).toBe(403);
    const mute = await admin.post('/api/chat/mutes').send({ userId: coop.member.id, minutes: 60, reason: 'Cool off for an hour' });
    expect(mute.status).toBe(201);
    const refused = await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'But listen' });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/muted you .* Cool off for an hour/);
    expect((await member.post(`/api/chat/threads/${topic.id}/messages`).send({ clientId: randomUUID(), body: 'here then' })).status).toBe(403);
    expect((await member.post('/api/chat/threads').send({ title: 'A new topic' })).status).toBe(403);
    expect((await channelOf(member)).mutedUntil).toBe(mute.body.until);
    await say(member, litter.id, 'The litter thread is still mine');
    expect((await admin.get('/api/chat/mutes')).body).toEqual([{ userId: coop.member.id, name: coop.member.name, until: mute.body.until, reason: 'Cool off for an hour' }]);
    expect((await admin.delete(`/api/chat/mutes/${coop.member.id}`)).body).toEqual({ lifted: 1 });
    await say(member, channel.id, 'Thanks, I will keep it civil');
  });
});

describe('Co-op Chat: live', () => {
  it('when sockets ask to join a litter\'s thread, then only its farm\'s are let in, and only they hear its messages', async () => {
    const coop = await createTestCoop();
    const other = await createTestCoop();
    const { thread } = await litterThread(coop);
    const apprentice = await server.kit.listen(coop.apprentice.email);
    const otherFarm = await server.kit.listen(coop.otherFarmMember.email);
    const foreign = await server.kit.listen(other.admin.email);

    expect(await join(apprentice.socket, thread.id)).toEqual({ ok: true });
    expect(await join(otherFarm.socket, thread.id)).toEqual({ ok: false, error: { code: 'not_found', message: 'That thread was not found' } });
    expect(await join(foreign.socket, thread.id)).toMatchObject({ ok: false, error: { code: 'not_found' } });
    expect(await join(foreign.socket, 'not-a-uuid')).toMatchObject({ ok: false, error: { code: 'validation_failed' } });

    const member = await agent(coop.member.email);
    const sent = await say(member, thread.id, 'Weaning on Thursday');
    await expect.poll(() => heardMessages(apprentice.heard).map((m) => m.id), { timeout: 3000 }).toEqual([sent.id]);
    expect((apprentice.heard.get(RealtimeEvent.chatActivity) ?? []) as unknown[]).toContainEqual({ threadId: thread.id, seq: sent.seq });
    await heardEverythingSoFar(otherFarm.socket, coop.otherFarmMember.id);
    await heardEverythingSoFar(foreign.socket, other.admin.id);
    expect(heardMessages(otherFarm.heard)).toEqual([]);
    expect(otherFarm.heard.get(RealtimeEvent.chatActivity)).toBeUndefined();
    expect(heardMessages(foreign.heard)).toEqual([]);
    expect(foreign.heard.get(RealtimeEvent.chatActivity)).toBeUndefined();
  });

  it('when a muted person posts in the channel, then the post is refused and no socket hears anything of it', async () => {
    const coop = await createTestCoop();
    const admin = await agent(coop.admin.email);
    const member = await agent(coop.member.email);
    const channel = await channelOf(member);
    const watcher = await server.kit.listen(coop.otherFarmMember.email);
    expect(await join(watcher.socket, channel.id)).toEqual({ ok: true });
    expect((await admin.post('/api/chat/mutes').send({ userId: coop.member.id, minutes: 30, reason: 'Heated argument' })).status).toBe(201);
    expect((await member.post(`/api/chat/threads/${channel.id}/messages`).send({ clientId: randomUUID(), body: 'muted words' })).status).toBe(403);
    await heardEverythingSoFar(watcher.socket, coop.otherFarmMember.id);
    expect(heardMessages(watcher.heard)).toEqual([]);
    expect(watcher.heard.get(RealtimeEvent.chatActivity)).toBeUndefined();
  });

  it('when a socket drops and another person posts three messages, then after reconnecting the client fetches all three once, in order', async () => {
    const coop = await createTestCoop();
    const member = await agent(coop.member.email);
    const otherFarm = await agent(coop.otherFarmMember.email);
    const channel = await channelOf(member);
    const first = await say(otherFarm, channel.id, 'Before the drop');

    // The client's view: messages by id, and the last seq it saw (from the page and live events).
    const shown = new Map<string, ChatMessageDto>();
    const show = (m: ChatMessageDto) => shown.set(m.id, m);
    ((await member.get(`/api/chat/threads/${channel.id}/messages`)).body as ChatMessagePageDto).items.forEach(show);
    const live = await server.kit.listen(coop.member.email);
    expect(await join(live.socket, channel.id)).toEqual({ ok: true });
    live.socket.on(RealtimeEvent.chatMessage, show);
    const during = await say(otherFarm, channel.id, 'While connected');
    await expect.poll(() => shown.has(during.id), { timeout: 3000 }).toBe(true);

    live.socket.disconnect();
    const missed = [];
    for (const text of ['Missed one', 'Missed two', 'Missed three']) missed.push(await say(otherFarm, channel.id, text));
    expect(shown.size).toBe(2);

    live.socket.connect();
    await new Promise<void>((resolve) => live.socket.once('connect', () => resolve()));
    expect(await join(live.socket, channel.id)).toEqual({ ok: true });
    const lastSeen = Math.max(...[...shown.values()].map((m) => m.seq));
    const caughtUp = (await member.get(`/api/chat/threads/${channel.id}/messages`).query({ after: lastSeen })).body as ChatMessagePageDto;
    expect(caughtUp.items.map((m) => m.body)).toEqual(['Missed one', 'Missed two', 'Missed three']);
    expect(caughtUp.hasMore).toBe(false);
    caughtUp.items.forEach(show);
    const inOrder = [...shown.values()].sort((a, b) => a.seq - b.seq).map((m) => m.id);
    expect(inOrder).toEqual([first.id, during.id, ...missed.map((m) => m.id)]);

    // And live again after the reconnect.
    const after = await say(otherFarm, channel.id, 'Back online');
    await expect.poll(() => shown.has(after.id), { timeout: 3000 }).toBe(true);
    expect(shown.size).toBe(6);
  });
});
