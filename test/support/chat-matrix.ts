import { randomUUID } from 'node:crypto';
import { connectDatabase } from '../../packages/server/src/composition/database';
import { listThreads, openSubjectThread, shareChatPhotos } from '../../packages/server/src/modules/chat/chat.service';
import { litterAs } from './almanac';
import { asTenant } from './db';
import { createTestMember, type TestCoop } from './factories';
import { actorOf } from './herd';
import { testImage } from './herd-files';

/** Objects of Co-op Chat's rows, made fresh for every cell that may change them. */
export interface ChatIds {
  /** The co-op's channel, with a message of farm A's member. */
  channelId?: string;
  messageId?: string;
  /** A litter of farm A, its thread and a message of farm A's member there. */
  litterId?: string;
  litterThreadId?: string;
  litterMessageId?: string;
  /** A member of farm B whom the admin may mute. */
  chatMuteUserId?: string;
  /** A photo in a message of the litter's thread (its farm's people alone see it). */
  chatPhotoId?: string;
}

async function storedMessage(coop: TestCoop, threadId: string, body: string, photo?: { id: string; width: number; height: number }): Promise<string> {
  return asTenant(coop.id, async (c) => {
    const { rows } = await c.query(
      `INSERT INTO chat_messages (coop_id, thread_id, author_id, author_farm_id, client_id, body, attachments, created_at)
       VALUES ($1, $2, $3, $4, $5, $6, $7::jsonb, now() - interval '1 hour') RETURNING id, seq`,
      [coop.id, threadId, coop.member.id, coop.member.farmId, randomUUID(), body, JSON.stringify(photo ? [photo] : [])],
    );
    if (photo) await c.query(`UPDATE photos SET chat_message_id = $2 WHERE id = $1`, [photo.id, rows[0].id]);
    await c.query(`UPDATE chat_threads SET last_seq = $2, last_message_at = now() WHERE id = $1`, [threadId, rows[0].seq]);
    return rows[0].id as string;
  }, { commit: true });
}

export async function chatTarget(coop: TestCoop, target: string): Promise<ChatIds> {
  if (target !== 'chatA') return {};
  connectDatabase(process.env.DATABASE_URL!);
  const member = actorOf(coop.member);
  const channel = (await listThreads(member)).items.find((t) => t.kind === 'channel')!;
  const { litter } = await litterAs(coop.member, { servicedDaysAgo: 40, kindledDaysAgo: 9, bornAlive: 5 });
  const thread = await openSubjectThread(member, 'litter', litter.id);
  // Written straight in the database: a cell per persona would soon pass the member's rate limit.
  const messageId = await storedMessage(coop, channel.id, 'Checked by the authorization matrix: hay');
  const litterMessageId = await storedMessage(coop, thread.id, 'Checked by the authorization matrix: kits');
  const [photo] = await shareChatPhotos(member, thread.id, [{ buffer: await testImage('png', { width: 40, height: 30 }) }], { photoMaxBytes: 1_000_000, photosPerAnimal: 4, photosPerUpload: 4 });
  await storedMessage(coop, thread.id, 'Checked by the authorization matrix: a photo', { id: photo!.id, width: photo!.width, height: photo!.height });
  const muted = await createTestMember(coop);
  return { channelId: channel.id, messageId, litterId: litter.id, litterThreadId: thread.id, litterMessageId, chatMuteUserId: muted.id, chatPhotoId: photo!.id };
}

export function chatBody(body: string | undefined, ids: ChatIds): object | undefined {
  switch (body) {
    case 'chatTopic':
      return { title: 'Checked by the authorization matrix' };
    case 'chatMessage':
      return { clientId: randomUUID(), body: 'Checked by the authorization matrix', mentions: [] };
    case 'chatEdit':
      return { body: 'Edited by the authorization matrix', mentions: [] };
    case 'chatRead':
      return { seq: Number.MAX_SAFE_INTEGER };
    case 'chatHide':
      return { reason: 'Checked by the authorization matrix' };
    case 'chatMute':
      return { userId: ids.chatMuteUserId, minutes: 30, reason: 'Checked by the authorization matrix' };
    default:
      return undefined;
  }
}

/** What a refused chat call must leave as it was: messages, reactions, read positions and mutes. */
export async function chatStateOf(coopId: string) {
  return asTenant(coopId, async (c) => ({
    messages: (await c.query(`SELECT string_agg(id::text || '=' || md5(body) || coalesce(edited_at::text, '') || coalesce(deleted_at::text, '') || coalesce(hidden_at::text, ''), ',' ORDER BY id) AS s FROM chat_messages`)).rows[0].s,
    threads: (await c.query('SELECT count(*)::int AS n FROM chat_threads')).rows[0].n,
    reactions: (await c.query('SELECT count(*)::int AS n FROM chat_reactions')).rows[0].n,
    reads: (await c.query(`SELECT string_agg(user_id::text || thread_id::text || '=' || read_seq, ',' ORDER BY user_id, thread_id) AS s FROM chat_read_positions`)).rows[0].s,
    mutes: (await c.query(`SELECT string_agg(id::text || coalesce(lifted_at::text, ''), ',' ORDER BY id) AS s FROM chat_mutes`)).rows[0].s,
  }));
}
