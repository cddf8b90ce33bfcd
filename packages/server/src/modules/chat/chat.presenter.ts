import type { ChatMessageDto, ChatReaction, ChatThreadDto, ChatThreadKind } from '@burrowline/shared';

export interface MessageRow {
  id: string;
  client_id: string;
  thread_id: string;
  seq: string;
  author_id: string;
  author_name: string;
  author_farm_id: string | null;
  author_farm_name: string | null;
  body: string;
  attachments: { id: string; width: number; height: number }[];
  created_at: Date;
  edited_at: Date | null;
  deleted_at: Date | null;
  hidden_at: Date | null;
  hidden_reason: string | null;
  mention_people: { id: string; name: string }[];
  reply_id: string | null;
  reply_author_name: string | null;
  reply_excerpt: string | null;
  reactions: { reaction: ChatReaction; userIds: string[] }[];
}

/** Who reads the message: the hidden reason is the author's and the admins' only; null for a live event. */
export interface MessageViewer {
  userId: string;
  moderates: boolean;
}

export function presentMessage(row: MessageRow, viewer: MessageViewer | null): ChatMessageDto {
  const state = row.hidden_at ? 'hidden' : row.deleted_at ? 'deleted' : 'visible';
  const seesReason = viewer !== null && (viewer.moderates || viewer.userId === row.author_id);
  return {
    id: row.id,
    clientId: row.client_id,
    threadId: row.thread_id,
    seq: Number(row.seq),
    author: { id: row.author_id, name: row.author_name, farmId: row.author_farm_id, farmName: row.author_farm_name },
    body: state === 'visible' ? row.body : null,
    state,
    hiddenReason: state === 'hidden' && seesReason ? row.hidden_reason : null,
    mentions: state === 'visible' ? row.mention_people : [],
    replyTo: row.reply_id ? { id: row.reply_id, authorName: row.reply_author_name ?? '', excerpt: row.reply_excerpt } : null,
    reactions: state === 'visible' ? row.reactions : [],
    attachments: state === 'visible'
      ? row.attachments.map((a) => ({ id: a.id, url: `/api/photos/${a.id}`, thumbnailUrl: `/api/photos/${a.id}/thumbnail`, width: a.width, height: a.height }))
      : [],
    createdAt: row.created_at.toISOString(),
    editedAt: row.edited_at ? row.edited_at.toISOString() : null,
  };
}

export interface ThreadRow {
  id: string;
  kind: ChatThreadKind;
  subject_type: string | null;
  subject_id: string | null;
  title: string;
  last_message_at: Date | null;
  last_seq: string;
  read_seq: string;
  unread: string;
  last_author_name: string | null;
  last_excerpt: string | null;
  muted_until: Date | null;
}

export function presentThread(row: ThreadRow, link: string | null): ChatThreadDto {
  const mutable = row.kind !== 'subject';
  return {
    id: row.id,
    kind: row.kind,
    subjectType: row.subject_type,
    subjectId: row.subject_id,
    title: row.title,
    link,
    lastMessageAt: row.last_message_at ? row.last_message_at.toISOString() : null,
    lastSeq: Number(row.last_seq),
    readSeq: Number(row.read_seq),
    unread: Number(row.unread),
    lastMessage: row.last_author_name !== null && row.last_excerpt !== null ? { authorName: row.last_author_name, excerpt: row.last_excerpt } : null,
    mutedUntil: mutable && row.muted_until ? row.muted_until.toISOString() : null,
  };
}
