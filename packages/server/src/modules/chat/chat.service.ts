import { QueryTypes, type Transaction } from 'sequelize';
import {
  chatMessageEditSchema, chatMessageInputSchema, defineAbilityFor, ErrorCode, RealtimeEvent, rooms, subjectOf,
  type ChatHideInput, type ChatMessageDto, type ChatMessageEdit, type ChatMessageInput, type ChatMessagePageDto, type ChatMessagesQuery,
  type ChatMuteDto, type ChatMuteInput, type ChatPersonDto, type ChatReaction, type ChatSearchHitDto, type ChatSearchQuery,
  type ChatThreadDto, type ChatThreadListDto, type ChatTopicInput, type PhotoDto,
} from '@burrowline/shared';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { recordAudit } from '../audit/audit.service';
import { notify } from '../notifications/notifications.service';
import { addChatPhotos, attachChatPhotosIn, removeChatPhotosIn, unsentChatPhotosIn, type PhotoLimits, type UploadedFile } from '../photos/photos.service';
import { readableSubjectThreads, threadSubjectOf, type ThreadParticipants } from './chat-subjects.service';
import { presentMessage, presentThread, type MessageRow, type MessageViewer, type ThreadRow } from './chat.presenter';

let rateLimit = { messages: 20, windowSeconds: 10 };

/** How many messages one person may send in a window (tests use a small window). */
export function configureChat(opts: { rateLimit: { messages: number; windowSeconds: number } }) {
  rateLimit = opts.rateLimit;
}

interface ThreadRecord {
  id: string;
  coop_id: string;
  kind: 'channel' | 'topic' | 'subject';
  subject_type: string | null;
  subject_id: string | null;
  title: string;
  last_seq: string;
}

const q = <T extends object>(tx: Transaction, sql: string, bind: unknown[]) =>
  database().query<T>(sql, { bind, type: QueryTypes.SELECT, transaction: tx });

const moderates = (actor: SessionUser) => defineAbilityFor(actor).can('moderate', subjectOf('ChatMessage', { coopId: actor.coopId }));
const viewerOf = (actor: SessionUser): MessageViewer => ({ userId: actor.id, moderates: moderates(actor) });
const THREAD = 'That thread';
const MESSAGE = 'That message';

/**
 * The thread if the actor may read it. The channel and topics are the whole co-op's; a subject's thread is
 * read by who reads the subject (its registered resolver). Anything else, or another co-op's, is a 404.
 */
async function readableThread(tx: Transaction, actor: SessionUser, threadId: string, opts: { lock?: boolean } = {}): Promise<ThreadRecord> {
  const [thread] = await q<ThreadRecord>(
    tx,
    `SELECT id, coop_id, kind, subject_type, subject_id, title, last_seq FROM chat_threads WHERE id = $1 AND coop_id = $2${opts.lock ? ' FOR UPDATE' : ''}`,
    [threadId, actor.coopId],
  );
  if (!thread) throw AppError.notFound(THREAD);
  if (thread.kind === 'subject') {
    const subject = threadSubjectOf(thread.subject_type!);
    if (!subject || !(await subject.mayRead(tx, actor, thread.subject_id!))) throw AppError.notFound(THREAD);
  }
  return thread;
}

/** The subject threads among the co-op's that the actor may read, by id. */
const readableSubjectThreadIds = readableSubjectThreads;

const THREAD_COLUMNS = `
  t.id, t.kind, t.subject_type, t.subject_id, t.title, t.last_message_at, t.last_seq,
  coalesce(rp.read_seq, 0) AS read_seq,
  (SELECT count(*) FROM (SELECT 1 FROM chat_messages m
     WHERE m.thread_id = t.id AND m.seq > coalesce(rp.read_seq, 0) AND m.author_id <> $2
       AND m.deleted_at IS NULL AND m.hidden_at IS NULL LIMIT 100) unread_rows) AS unread,
  lm.author_name AS last_author_name, lm.excerpt AS last_excerpt,
  (SELECT max(until) FROM chat_mutes WHERE user_id = $2 AND lifted_at IS NULL AND until > now()) AS muted_until`;

const THREAD_FROM = `
  FROM chat_threads t
  LEFT JOIN chat_read_positions rp ON rp.thread_id = t.id AND rp.user_id = $2
  LEFT JOIN LATERAL (
    SELECT u.name AS author_name,
           CASE WHEN m.deleted_at IS NOT NULL OR m.hidden_at IS NOT NULL THEN 'Message removed'
                WHEN m.body = '' THEN 'Sent a photo' ELSE left(m.body, 120) END AS excerpt
      FROM chat_messages m JOIN users u ON u.id = m.author_id
     WHERE m.thread_id = t.id ORDER BY m.seq DESC LIMIT 1) lm ON true`;

function linkOf(row: { kind: string; subject_type: string | null; subject_id: string | null }): string | null {
  if (row.kind !== 'subject') return null;
  return threadSubjectOf(row.subject_type!)?.link(row.subject_id!) ?? null;
}

async function presentedThread(tx: Transaction, actor: SessionUser, threadId: string): Promise<ChatThreadDto> {
  const [row] = await q<ThreadRow>(tx, `SELECT ${THREAD_COLUMNS} ${THREAD_FROM} WHERE t.coop_id = $1 AND t.id = $3`, [actor.coopId, actor.id, threadId]);
  if (!row) throw AppError.notFound(THREAD);
  return presentThread(row, linkOf(row));
}

async function ensureChannel(tx: Transaction, coopId: string): Promise<void> {
  await q(tx, `INSERT INTO chat_threads (coop_id, kind, title) VALUES ($1, 'channel', 'Co-op channel') ON CONFLICT DO NOTHING`, [coopId]);
}

/**
 * The person's threads: the co-op's channel first, then topics and the subject threads they may read,
 * latest activity first, each with its unread count (up to 100) and the total.
 */
export async function listThreads(actor: SessionUser): Promise<ChatThreadListDto> {
  return withTenant(actor, async (tx) => {
    const subjectIds = await readableSubjectThreadIds(tx, actor);
    const read = () => q<ThreadRow>(
      tx,
      `SELECT ${THREAD_COLUMNS} ${THREAD_FROM}
        WHERE t.coop_id = $1 AND (t.kind IN ('channel', 'topic') OR t.id = ANY($3::uuid[]))
        ORDER BY (t.kind = 'channel') DESC, t.last_message_at DESC NULLS LAST, t.id LIMIT 300`,
      [actor.coopId, actor.id, subjectIds],
    );
    let rows = await read();
    if (!rows.some((r) => r.kind === 'channel')) {
      // The co-op's first visit: its channel comes into being.
      await ensureChannel(tx, actor.coopId);
      rows = await read();
    }
    const items = rows.map((row) => presentThread(row, linkOf(row)));
    return { items, totalUnread: items.reduce((sum, t) => sum + t.unread, 0) };
  });
}

/** One thread the person may read, with their read position and unread count. */
export async function getThread(actor: SessionUser, threadId: string): Promise<ChatThreadDto> {
  return withTenant(actor, async (tx) => {
    await readableThread(tx, actor, threadId);
    return presentedThread(tx, actor, threadId);
  });
}

async function currentMute(tx: Transaction, userId: string): Promise<{ until: Date; reason: string } | null> {
  const [mute] = await q<{ until: Date; reason: string }>(
    tx, `SELECT until, reason FROM chat_mutes WHERE user_id = $1 AND lifted_at IS NULL AND until > now() ORDER BY until DESC LIMIT 1`, [userId],
  );
  return mute ?? null;
}

async function refuseIfMuted(tx: Transaction, actor: SessionUser): Promise<void> {
  const mute = await currentMute(tx, actor.id);
  if (mute) {
    throw new AppError(ErrorCode.forbidden, 403, `The admin muted you in the co-op's channel until ${mute.until.toISOString().slice(0, 16).replace('T', ' ')} UTC: ${mute.reason}`);
  }
}

/** A topic in the channel that any member starts, e.g. "heat this week". */
export async function startTopic(actor: SessionUser, input: ChatTopicInput): Promise<ChatThreadDto> {
  return withTenant(actor, async (tx) => {
    await refuseIfMuted(tx, actor);
    const [row] = await q<{ id: string }>(
      tx, `INSERT INTO chat_threads (coop_id, kind, title, created_by) VALUES ($1, 'topic', $2, $3) RETURNING id`, [actor.coopId, input.title, actor.id],
    );
    tx.afterCommit(() => publish(rooms.coop(actor.coopId), RealtimeEvent.chatActivity, { threadId: row!.id, seq: 0 }));
    return presentedThread(tx, actor, row!.id);
  });
}

/**
 * The thread of a subject (a litter, a processing day, a loan), made when first opened. Refused as a 404
 * when the subject's type is unknown or the actor may not read the subject.
 */
export async function openSubjectThread(actor: SessionUser, subjectType: string, subjectId: string): Promise<ChatThreadDto> {
  return withTenant(actor, async (tx) => {
    const subject = threadSubjectOf(subjectType);
    if (!subject || !(await subject.mayRead(tx, actor, subjectId))) throw AppError.notFound(THREAD);
    const title = (await subject.title(tx, subjectId)).slice(0, 200);
    const [row] = await q<{ id: string }>(
      tx,
      `INSERT INTO chat_threads (coop_id, kind, subject_type, subject_id, title) VALUES ($1, 'subject', $2, $3, $4)
       ON CONFLICT (coop_id, subject_type, subject_id) WHERE kind = 'subject' DO UPDATE SET title = EXCLUDED.title
       RETURNING id`,
      [actor.coopId, subjectType, subjectId, title],
    );
    return presentedThread(tx, actor, row!.id);
  });
}

const MESSAGE_SELECT = `
  SELECT m.id, m.client_id, m.thread_id, m.seq, m.author_id, u.name AS author_name, m.author_farm_id, f.name AS author_farm_name,
         m.body, m.attachments, m.created_at, m.edited_at, m.deleted_at, m.hidden_at, m.hidden_reason,
         (SELECT coalesce(json_agg(json_build_object('id', mu.id, 'name', mu.name) ORDER BY mu.name), '[]'::json)
            FROM users mu WHERE mu.id = ANY(m.mentions)) AS mention_people,
         r.id AS reply_id, ru.name AS reply_author_name,
         CASE WHEN r.deleted_at IS NULL AND r.hidden_at IS NULL THEN CASE WHEN r.body = '' THEN 'Photo' ELSE left(r.body, 160) END END AS reply_excerpt,
         (SELECT coalesce(json_agg(json_build_object('reaction', x.reaction, 'userIds', x.user_ids) ORDER BY x.first_at), '[]'::json)
            FROM (SELECT reaction, array_agg(user_id ORDER BY created_at) AS user_ids, min(created_at) AS first_at
                    FROM chat_reactions WHERE message_id = m.id GROUP BY reaction) x) AS reactions
    FROM chat_messages m
    JOIN users u ON u.id = m.author_id
    LEFT JOIN farms f ON f.id = m.author_farm_id
    LEFT JOIN chat_messages r ON r.id = m.reply_to_id
    LEFT JOIN users ru ON ru.id = r.author_id`;

async function messageRow(tx: Transaction, messageId: string): Promise<MessageRow> {
  const [row] = await q<MessageRow>(tx, `${MESSAGE_SELECT} WHERE m.id = $1`, [messageId]);
  if (!row) throw AppError.notFound(MESSAGE);
  return row;
}

/**
 * The statement of a page: the thread's order index (thread_id, seq) walked from one end, one row more than
 * the page to tell whether more exist. Public for the bench, which EXPLAINs exactly this statement.
 */
export function messagePageQuery(threadId: string, query: ChatMessagesQuery): { sql: string; bind: unknown[] } {
  const forward = query.after !== undefined;
  return {
    sql: forward
      ? `${MESSAGE_SELECT} WHERE m.thread_id = $1 AND m.seq > $2 ORDER BY m.seq ASC LIMIT $3`
      : `${MESSAGE_SELECT} WHERE m.thread_id = $1 AND m.seq < $2 ORDER BY m.seq DESC LIMIT $3`,
    bind: [threadId, forward ? query.after : (query.before ?? Number.MAX_SAFE_INTEGER), query.limit + 1],
  };
}

/**
 * A page of the thread: the latest messages, or older ones `before` a seq (keyset paging, never an
 * offset), or what came `after` a seq (catching up after a reconnect). Always oldest first.
 */
export async function listMessages(actor: SessionUser, threadId: string, query: ChatMessagesQuery): Promise<ChatMessagePageDto> {
  return withTenant(actor, async (tx) => {
    await readableThread(tx, actor, threadId);
    const forward = query.after !== undefined;
    const page = messagePageQuery(threadId, query);
    const rows = await q<MessageRow>(tx, page.sql, page.bind);
    const hasMore = rows.length > query.limit;
    const items = rows.slice(0, query.limit);
    if (!forward) items.reverse();
    const viewer = viewerOf(actor);
    return { items: items.map((row) => presentMessage(row, viewer)), hasMore };
  });
}

async function participantsOf(tx: Transaction, thread: ThreadRecord): Promise<ThreadParticipants | null> {
  if (thread.kind !== 'subject') return null;
  return (await threadSubjectOf(thread.subject_type!)?.participants(tx, thread.subject_id!)) ?? { farmIds: [], userIds: [] };
}

/** The people named in a message must be the co-op's and able to read the thread; nobody else is told. */
async function checkedMentions(tx: Transaction, actor: SessionUser, thread: ThreadRecord, mentions: string[], body: string): Promise<string[]> {
  const ids = [...new Set(mentions)].filter((id) => id !== actor.id);
  if (ids.length === 0) return [];
  const people = await q<{ id: string; name: string; farm_id: string | null }>(
    tx, `SELECT id, name, farm_id FROM users WHERE coop_id = $1 AND id = ANY($2::uuid[]) AND disabled_at IS NULL`, [actor.coopId, ids],
  );
  const participants = await participantsOf(tx, thread);
  const mayRead = (p: { id: string; farm_id: string | null }) =>
    participants === null || participants.userIds.includes(p.id) || (p.farm_id !== null && participants.farmIds.includes(p.farm_id));
  const problems: string[] = [];
  if (people.length !== ids.length) problems.push('Someone you mentioned is not in the co-op');
  for (const p of people) {
    if (!mayRead(p)) problems.push(`${p.name} cannot read this thread`);
    else if (!body.includes(`@${p.name}`)) problems.push(`Write @${p.name} in the message to mention them`);
  }
  if (problems.length > 0) throw AppError.validation({ mentions: problems });
  return ids;
}

async function tellMentioned(tx: Transaction, actor: SessionUser, thread: ThreadRecord, messageId: string, userIds: string[], body: string) {
  const excerpt = body.length > 280 ? `${body.slice(0, 279)}…` : body;
  for (const userId of userIds) {
    await notify(tx, {
      coopId: actor.coopId,
      userIds: [userId],
      apprentices: true,
      exceptUserId: actor.id,
      kind: 'chat.mention',
      title: `${actor.name} mentioned you in ${thread.title}`.slice(0, 300),
      body: excerpt,
      link: `/chat/${thread.id}?message=${messageId}`,
      mail: { subject: `${actor.name} mentioned you in Co-op Chat`, text: `${actor.name} wrote in ${thread.title}:\n\n${excerpt}` },
      // Once per message and person: an edit that keeps a mention tells nobody again.
      key: `chat.mention:${messageId}:${userId}`,
    });
  }
}

/** Announces a message (after commit) to the thread's room and who should see the unread count change. */
function announce(tx: Transaction, actor: SessionUser, thread: ThreadRecord, row: MessageRow, participants: ThreadParticipants | null, activity: boolean) {
  const message = presentMessage(row, null);
  tx.afterCommit(() => {
    publish(rooms.chatThread(thread.id), RealtimeEvent.chatMessage, message);
    if (!activity) return;
    const seq = { threadId: thread.id, seq: message.seq };
    if (participants === null) {
      publish(rooms.coop(actor.coopId), RealtimeEvent.chatActivity, seq);
      return;
    }
    for (const farmId of participants.farmIds) publish(rooms.farm(farmId), RealtimeEvent.chatActivity, seq);
    for (const userId of participants.userIds) publish(rooms.user(userId), RealtimeEvent.chatActivity, seq);
  });
}

export interface SentMessage {
  message: ChatMessageDto;
  /** False when the client id was seen before: the stored message is answered again. */
  created: boolean;
}

/**
 * Posts a message. The client's id is the idempotency key: the same id with the same text answers the
 * stored message; with other text it is a 409. Refused while muted (channel and topics) or past the rate limit.
 */
export async function postMessage(actor: SessionUser, threadId: string, raw: ChatMessageInput): Promise<SentMessage> {
  const input = chatMessageInputSchema.parse(raw);
  return withTenant(actor, async (tx) => {
    // The thread's row lock orders its sends: a message's seq is taken after the one before it committed, so a
    // client catching up "after seq N" can never miss one that commits later with a smaller seq.
    const thread = await readableThread(tx, actor, threadId, { lock: true });
    const [earlier] = await q<{ id: string; thread_id: string; body: string }>(
      tx, `SELECT id, thread_id, body FROM chat_messages WHERE coop_id = $1 AND author_id = $2 AND client_id = $3`, [actor.coopId, actor.id, input.clientId],
    );
    if (earlier) {
      if (earlier.thread_id !== threadId || earlier.body !== input.body) throw AppError.conflict('That message id was used for another message');
      return { message: presentMessage(await messageRow(tx, earlier.id), viewerOf(actor)), created: false };
    }
    if (thread.kind !== 'subject') await refuseIfMuted(tx, actor);
    const [{ recent } = { recent: '0' }] = await q<{ recent: string }>(
      tx,
      `SELECT count(*) AS recent FROM (SELECT 1 FROM chat_messages WHERE author_id = $1 AND created_at > now() - make_interval(secs => $2) LIMIT $3) r`,
      [actor.id, rateLimit.windowSeconds, rateLimit.messages],
    );
    if (Number(recent) >= rateLimit.messages) {
      throw new AppError(ErrorCode.rateLimited, 429, `That is more than ${rateLimit.messages} messages in ${rateLimit.windowSeconds} seconds; wait a moment, then send again`);
    }
    if (input.replyToId) {
      const [target] = await q<{ id: string }>(tx, `SELECT id FROM chat_messages WHERE id = $1 AND thread_id = $2`, [input.replyToId, threadId]);
      if (!target) throw AppError.validation({ replyToId: ['That message is not in this thread'] });
    }
    const mentions = await checkedMentions(tx, actor, thread, input.mentions, input.body);
    const attachments = await unsentChatPhotosIn(tx, actor, threadId, input.attachmentIds);
    const [inserted] = await q<{ id: string; seq: string }>(
      tx,
      `INSERT INTO chat_messages (coop_id, thread_id, author_id, author_farm_id, client_id, body, reply_to_id, mentions, attachments)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8::uuid[], $9::jsonb) RETURNING id, seq`,
      [actor.coopId, threadId, actor.id, actor.farmId, input.clientId, input.body, input.replyToId ?? null, mentions, JSON.stringify(attachments)],
    );
    const seq = inserted!.seq;
    await attachChatPhotosIn(tx, inserted!.id, input.attachmentIds);
    await q(tx, `UPDATE chat_threads SET last_seq = GREATEST(last_seq, $2), last_message_at = now() WHERE id = $1`, [threadId, seq]);
    // One's own message is read.
    await q(
      tx,
      `INSERT INTO chat_read_positions (thread_id, user_id, coop_id, read_seq) VALUES ($1, $2, $3, $4)
       ON CONFLICT (user_id, thread_id) DO UPDATE SET read_seq = GREATEST(chat_read_positions.read_seq, EXCLUDED.read_seq), updated_at = now()`,
      [threadId, actor.id, actor.coopId, seq],
    );
    await tellMentioned(tx, actor, thread, inserted!.id, mentions, input.body);
    const row = await messageRow(tx, inserted!.id);
    announce(tx, actor, thread, row, await participantsOf(tx, thread), true);
    return { message: presentMessage(row, viewerOf(actor)), created: true };
  });
}

/** The message and its thread, if the actor may read the thread. */
async function readableMessage(tx: Transaction, actor: SessionUser, messageId: string, lock = false) {
  const [row] = await q<{ id: string; thread_id: string; author_id: string; deleted_at: Date | null; hidden_at: Date | null }>(
    tx, `SELECT id, thread_id, author_id, deleted_at, hidden_at FROM chat_messages WHERE id = $1 AND coop_id = $2${lock ? ' FOR UPDATE' : ''}`,
    [messageId, actor.coopId],
  );
  if (!row) throw AppError.notFound(MESSAGE);
  const thread = await readableThread(tx, actor, row.thread_id).catch(() => {
    throw AppError.notFound(MESSAGE);
  });
  return { message: row, thread };
}

function refuseUnlessLive(message: { deleted_at: Date | null; hidden_at: Date | null }) {
  if (message.deleted_at) throw AppError.conflict('That message was removed');
  if (message.hidden_at) throw AppError.conflict('That message was hidden by the admin');
}

/** Edits one's own message (marked "edited"); newly mentioned people are told, the others not again. */
export async function editMessage(actor: SessionUser, messageId: string, raw: ChatMessageEdit): Promise<ChatMessageDto> {
  const input = chatMessageEditSchema.parse(raw);
  return withTenant(actor, async (tx) => {
    const { message, thread } = await readableMessage(tx, actor, messageId, true);
    if (message.author_id !== actor.id) throw new AppError(ErrorCode.forbidden, 403, 'Only its author edits a message');
    refuseUnlessLive(message);
    const mentions = await checkedMentions(tx, actor, thread, input.mentions, input.body);
    await q(tx, `UPDATE chat_messages SET body = $2, mentions = $3::uuid[], edited_at = now() WHERE id = $1`, [messageId, input.body, mentions]);
    await tellMentioned(tx, actor, thread, messageId, mentions, input.body);
    const row = await messageRow(tx, messageId);
    announce(tx, actor, thread, row, null, false);
    return presentMessage(row, viewerOf(actor));
  });
}

/** Removes one's own message: its text goes, a "message removed" placeholder stays so replies keep their sense. */
export async function deleteMessage(actor: SessionUser, messageId: string): Promise<ChatMessageDto> {
  return withTenant(actor, async (tx) => {
    const { message, thread } = await readableMessage(tx, actor, messageId, true);
    if (message.author_id !== actor.id) throw new AppError(ErrorCode.forbidden, 403, 'Only its author removes a message; the admin may hide it');
    if (!message.deleted_at) {
      await q(tx, `UPDATE chat_messages SET body = '', mentions = '{}', attachments = '[]', deleted_at = now() WHERE id = $1`, [messageId]);
      await removeChatPhotosIn(tx, actor.coopId, messageId);
    }
    const row = await messageRow(tx, messageId);
    announce(tx, actor, thread, row, null, false);
    return presentMessage(row, viewerOf(actor));
  });
}

/** The admin hides a message with a reason: the text is kept for the audit, the author is told. */
export async function hideMessage(actor: SessionUser, messageId: string, input: ChatHideInput): Promise<ChatMessageDto> {
  return withTenant(actor, async (tx) => {
    const { message, thread } = await readableMessage(tx, actor, messageId, true);
    if (!moderates(actor)) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin hides messages');
    if (message.deleted_at) throw AppError.conflict('That message was removed by its author');
    if (!message.hidden_at) {
      await q(tx, `UPDATE chat_messages SET hidden_at = now(), hidden_by = $2, hidden_reason = $3 WHERE id = $1`, [messageId, actor.id, input.reason]);
      await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: 'chat_message.hidden', subjectType: 'ChatMessage', subjectId: messageId, details: { reason: input.reason, authorId: message.author_id } }, tx);
      await notify(tx, {
        coopId: actor.coopId,
        userIds: [message.author_id],
        apprentices: true,
        exceptUserId: actor.id,
        kind: 'chat.hidden',
        title: `The admin hid your message in ${thread.title}`.slice(0, 300),
        body: `Reason: ${input.reason}`,
        link: `/chat/${thread.id}?message=${messageId}`,
        mail: { subject: 'The admin hid one of your chat messages', text: `Your message in ${thread.title} was hidden by the co-op's admin.\n\nReason: ${input.reason}` },
        key: `chat.hidden:${messageId}`,
      });
    }
    const row = await messageRow(tx, messageId);
    announce(tx, actor, thread, row, null, false);
    return presentMessage(row, viewerOf(actor));
  });
}

/** Adds or takes back one's reaction (from the fixed set) to a live message. */
export async function setReaction(actor: SessionUser, messageId: string, reaction: ChatReaction, on: boolean): Promise<ChatMessageDto> {
  return withTenant(actor, async (tx) => {
    const { message, thread } = await readableMessage(tx, actor, messageId);
    refuseUnlessLive(message);
    if (on) {
      await q(tx, `INSERT INTO chat_reactions (message_id, user_id, reaction, coop_id) VALUES ($1, $2, $3, $4) ON CONFLICT DO NOTHING`, [messageId, actor.id, reaction, actor.coopId]);
    } else {
      await q(tx, `DELETE FROM chat_reactions WHERE message_id = $1 AND user_id = $2 AND reaction = $3`, [messageId, actor.id, reaction]);
    }
    const row = await messageRow(tx, messageId);
    announce(tx, actor, thread, row, null, false);
    return presentMessage(row, viewerOf(actor));
  });
}

/** Moves the person's read position forward (never back) to `seq`, at most the thread's last message. */
export async function markRead(actor: SessionUser, threadId: string, seq: number): Promise<ChatThreadDto> {
  return withTenant(actor, async (tx) => {
    const thread = await readableThread(tx, actor, threadId);
    await q(
      tx,
      `INSERT INTO chat_read_positions (thread_id, user_id, coop_id, read_seq) VALUES ($1, $2, $3, LEAST($4::bigint, $5::bigint))
       ON CONFLICT (user_id, thread_id) DO UPDATE SET read_seq = GREATEST(chat_read_positions.read_seq, EXCLUDED.read_seq), updated_at = now()`,
      [threadId, actor.id, actor.coopId, seq, thread.last_seq],
    );
    tx.afterCommit(() => publish(rooms.user(actor.id), RealtimeEvent.chatActivity, { threadId, seq }));
    return presentedThread(tx, actor, threadId);
  });
}

/** People who may be mentioned in the thread (they may read it), by the start of a name. */
export async function mentionablePeople(actor: SessionUser, threadId: string, search: string): Promise<ChatPersonDto[]> {
  return withTenant(actor, async (tx) => {
    const thread = await readableThread(tx, actor, threadId);
    const participants = await participantsOf(tx, thread);
    const rows = await q<{ id: string; name: string; farm_name: string | null }>(
      tx,
      `SELECT u.id, u.name, f.name AS farm_name FROM users u LEFT JOIN farms f ON f.id = u.farm_id
        WHERE u.coop_id = $1 AND u.disabled_at IS NULL AND u.password_hash IS NOT NULL AND u.id <> $2
          AND (u.name ILIKE $3 || '%' OR u.name ILIKE '% ' || $3 || '%')
          AND ($4::boolean OR u.id = ANY($5::uuid[]) OR u.farm_id = ANY($6::uuid[]))
        ORDER BY u.name, u.id LIMIT 8`,
      [actor.coopId, actor.id, search.replace(/[\\%_]/g, (c) => `\\${c}`), participants === null, participants?.userIds ?? [], participants?.farmIds ?? []],
    );
    return rows.map((r) => ({ id: r.id, name: r.name, farmName: r.farm_name }));
  });
}

/** Full-text search over the co-op's messages, only in threads the person may read; newest first. */
export async function searchMessages(actor: SessionUser, query: ChatSearchQuery): Promise<ChatSearchHitDto[]> {
  return withTenant(actor, async (tx) => {
    const subjectIds = await readableSubjectThreadIds(tx, actor);
    const rows = await q<MessageRow & { thread_title: string; snippet: string }>(
      tx,
      `${MESSAGE_SELECT.replace('SELECT m.id,', `SELECT t.title AS thread_title,
              ts_headline('english', m.body, websearch_to_tsquery('english', $3), 'StartSel=«,StopSel=»,MaxWords=24,MinWords=8') AS snippet, m.id,`)}
        JOIN chat_threads t ON t.id = m.thread_id
       WHERE m.coop_id = $1 AND m.search @@ websearch_to_tsquery('english', $3)
         AND m.deleted_at IS NULL AND m.hidden_at IS NULL
         AND (t.kind IN ('channel', 'topic') OR t.id = ANY($2::uuid[]))
       ORDER BY m.seq DESC LIMIT $4`,
      [actor.coopId, subjectIds, query.q, query.limit],
    );
    const viewer = viewerOf(actor);
    return rows.map((row) => ({ message: presentMessage(row, viewer), threadTitle: row.thread_title, snippet: row.snippet }));
  });
}

function refuseUnlessModerator(actor: SessionUser) {
  if (!moderates(actor)) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin mutes people');
}

/** The admin mutes a person in the co-op's channel and topics for a while (subject threads stay open to them). */
export async function mutePerson(actor: SessionUser, input: ChatMuteInput): Promise<ChatMuteDto> {
  return withTenant(actor, async (tx) => {
    refuseUnlessModerator(actor);
    const [person] = await q<{ id: string; name: string; role: string }>(tx, `SELECT id, name, role FROM users WHERE id = $1 AND coop_id = $2`, [input.userId, actor.coopId]);
    if (!person) throw AppError.notFound('That person');
    if (person.id === actor.id) throw AppError.validation({ userId: ['You cannot mute yourself'] });
    const [mute] = await q<{ until: Date }>(
      tx, `INSERT INTO chat_mutes (coop_id, user_id, muted_by, until, reason) VALUES ($1, $2, $3, now() + make_interval(mins => $4), $5) RETURNING until`,
      [actor.coopId, person.id, actor.id, input.minutes, input.reason],
    );
    await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: 'chat_mute.created', subjectType: 'User', subjectId: person.id, details: { minutes: input.minutes, reason: input.reason } }, tx);
    return { userId: person.id, name: person.name, until: mute!.until.toISOString(), reason: input.reason };
  });
}

/** The admin lifts a person's mutes. */
export async function liftMute(actor: SessionUser, userId: string): Promise<{ lifted: number }> {
  return withTenant(actor, async (tx) => {
    refuseUnlessModerator(actor);
    const [person] = await q<{ id: string }>(tx, `SELECT id FROM users WHERE id = $1 AND coop_id = $2`, [userId, actor.coopId]);
    if (!person) throw AppError.notFound('That person');
    const rows = await q<{ id: string }>(tx, `UPDATE chat_mutes SET lifted_at = now() WHERE user_id = $1 AND lifted_at IS NULL AND until > now() RETURNING id`, [userId]);
    if (rows.length > 0) await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: 'chat_mute.lifted', subjectType: 'User', subjectId: userId }, tx);
    return { lifted: rows.length };
  });
}

/** The people muted now, for the admin. */
export async function listMutes(actor: SessionUser): Promise<ChatMuteDto[]> {
  return withTenant(actor, async (tx) => {
    refuseUnlessModerator(actor);
    const rows = await q<{ user_id: string; name: string; until: Date; reason: string }>(
      tx,
      `SELECT DISTINCT ON (m.user_id) m.user_id, u.name, m.until, m.reason FROM chat_mutes m JOIN users u ON u.id = m.user_id
        WHERE m.lifted_at IS NULL AND m.until > now() ORDER BY m.user_id, m.until DESC`,
      [],
    );
    return rows.map((r) => ({ userId: r.user_id, name: r.name, until: r.until.toISOString(), reason: r.reason }));
  });
}

/** The socket's request to join a thread's room: allowed exactly when the person may read the thread. */
export async function mayJoinThread(actor: SessionUser, threadId: string): Promise<void> {
  await withTenant(actor, (tx) => readableThread(tx, actor, threadId));
}

/**
 * Whether the viewer may see a chat photo: it is in a live message of a thread they read (a hidden message's
 * only to the admins, who keep it for the audit); a photo not sent yet is its uploader's alone.
 */
export async function mayReadChatPhoto(tx: Transaction, actor: SessionUser, photo: { threadId: string; messageId: string | null; uploadedBy: string | null }): Promise<boolean> {
  try {
    await readableThread(tx, actor, photo.threadId);
  } catch {
    return false;
  }
  if (photo.messageId === null) return photo.uploadedBy === actor.id;
  const [message] = await q<{ deleted_at: Date | null; hidden_at: Date | null }>(tx, `SELECT deleted_at, hidden_at FROM chat_messages WHERE id = $1`, [photo.messageId]);
  if (!message || message.deleted_at) return false;
  return !message.hidden_at || moderates(actor);
}

/** Who may share photos in the thread: who may write there (reads it, and is not muted in the channel). */
async function writableThread(tx: Transaction, actor: SessionUser, threadId: string): Promise<ThreadRecord> {
  const thread = await readableThread(tx, actor, threadId);
  if (thread.kind !== 'subject') await refuseIfMuted(tx, actor);
  return thread;
}

/** Settles before an upload is read whether the person may share photos in the thread. */
export async function assertCanShareChatPhotos(actor: SessionUser, threadId: string): Promise<void> {
  await withTenant(actor, (tx) => writableThread(tx, actor, threadId));
}

/**
 * Photos for a message not yet sent, through the photo pipeline (checked by content, re-encoded without
 * metadata, with thumbnails). The message that carries them names their ids.
 */
export async function shareChatPhotos(actor: SessionUser, threadId: string, files: UploadedFile[], limits: PhotoLimits): Promise<PhotoDto[]> {
  return addChatPhotos(actor, (tx) => writableThread(tx, actor, threadId), { files }, limits);
}
