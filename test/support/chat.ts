import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { expect } from 'vitest';
import { CSRF_HEADER, type ChatMessageDto, type ChatThreadDto, type ChatThreadListDto } from '@burrowline/shared';
import { asTenant } from './db';
import { TEST_PASSWORD } from './global-setup';

export type ChatAgent = ReturnType<typeof supertest.agent>;

/** A signed-in agent against a listening server (sockets and HTTP share it). */
export async function chatAgent(url: string, email: string): Promise<ChatAgent> {
  const agent = supertest.agent(url).set(CSRF_HEADER, '1');
  expect((await agent.post('/api/session').send({ email, password: TEST_PASSWORD })).status).toBe(200);
  return agent;
}

export async function channelOf(agent: ChatAgent): Promise<ChatThreadDto> {
  const res = await agent.get('/api/chat/threads');
  expect(res.status).toBe(200);
  const channel = (res.body as ChatThreadListDto).items.find((t) => t.kind === 'channel');
  expect(channel).toBeDefined();
  return channel!;
}

export async function say(agent: ChatAgent, threadId: string, body: string, extra: { mentions?: string[]; replyToId?: string; clientId?: string } = {}): Promise<ChatMessageDto> {
  const res = await agent.post(`/api/chat/threads/${threadId}/messages`).send({ clientId: extra.clientId ?? randomUUID(), body, mentions: extra.mentions ?? [], replyToId: extra.replyToId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as ChatMessageDto;
}

/** Fills a thread with `count` messages straight in the database (far quicker than the API for paging and benches). */
export async function fillThread(coopId: string, threadId: string, authorId: string, count: number, prefix = 'Message number') {
  await asTenant(coopId, async (c) => {
    await c.query(
      `INSERT INTO chat_messages (coop_id, thread_id, author_id, client_id, body, created_at)
       SELECT $1, $2, $3, gen_random_uuid(), $5 || i, now() - make_interval(secs => $4 - i) FROM generate_series(1, $4) i`,
      [coopId, threadId, authorId, count, `${prefix} `],
    );
    await c.query(`UPDATE chat_threads SET last_seq = (SELECT max(seq) FROM chat_messages WHERE thread_id = $1), last_message_at = now() WHERE id = $1`, [threadId]);
  }, { commit: true });
}

export async function chatRows(coopId: string, threadId: string) {
  return (await asTenant(coopId, (c) => c.query(`SELECT id, client_id, body, author_id, deleted_at, hidden_at, hidden_reason FROM chat_messages WHERE thread_id = $1 ORDER BY seq`, [threadId]))).rows;
}

export async function notificationsOf(coopId: string, kind: string) {
  return (await asTenant(coopId, (c) => c.query(`SELECT user_id, title, link FROM notifications WHERE kind = $1 ORDER BY created_at`, [kind]))).rows as { user_id: string; title: string; link: string }[];
}
