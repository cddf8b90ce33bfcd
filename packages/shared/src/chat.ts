import { z } from 'zod';

/** The most a message may say: long enough for a careful note, short enough to read in a thread. */
export const CHAT_MESSAGE_MAX = 4000;
export const CHAT_PAGE_SIZE = 50;
/** Photos one message may carry. */
export const CHAT_ATTACHMENTS_MAX = 4;

/** The small fixed set of reactions; the client shows each as its emoji. */
export const chatReactions = ['thumbs-up', 'heart', 'laugh', 'wow', 'thanks', 'check'] as const;
export type ChatReaction = (typeof chatReactions)[number];
export const chatReactionEmoji: Record<ChatReaction, string> = {
  'thumbs-up': '👍', heart: '❤️', laugh: '😄', wow: '😮', thanks: '🙏', check: '✅',
};

export const chatThreadKinds = ['channel', 'topic', 'subject'] as const;
export type ChatThreadKind = (typeof chatThreadKinds)[number];

const uuid = (what: string) => z.uuid({ error: `${what} was not found` });

export const chatThreadIdSchema = uuid('That thread');
export const chatMessageIdSchema = uuid('That message');
export const chatUserIdSchema = uuid('That person');
/** A subject's type as registered by the module that owns it: "litter", "processing-day", "loan". */
export const chatSubjectTypeSchema = z.string().regex(/^[a-z][a-z-]{1,39}$/, 'That kind of thread does not exist');

const bodyText = z.string().trim().max(CHAT_MESSAGE_MAX, `A message holds up to ${CHAT_MESSAGE_MAX.toLocaleString('en-US')} characters`);
const messageBody = bodyText.min(1, 'Write something first');

export const chatMessageInputSchema = z
  .strictObject({
    /** Chosen by the client before the first try: the same id again is the same message (a retry never duplicates). */
    clientId: z.uuid({ error: 'A message needs its client id' }),
    body: bodyText.default(''),
    replyToId: z.uuid({ error: 'That message was not found' }).nullish(),
    /** The people the text names with "@Name"; only those are told. */
    mentions: z.array(z.uuid({ error: 'That person was not found' })).max(20, 'Mention at most 20 people').default([]),
    /** Photos uploaded to the thread beforehand (POST …/attachments), in the order to show them. */
    attachmentIds: z
      .array(z.uuid({ error: 'That photo was not found' }))
      .max(CHAT_ATTACHMENTS_MAX, `A message carries at most ${CHAT_ATTACHMENTS_MAX} photos`)
      .refine((ids) => new Set(ids).size === ids.length, 'A photo is attached once')
      .default([]),
  })
  .refine((m) => m.body.length > 0 || m.attachmentIds.length > 0, { message: 'Write something first', path: ['body'] });
export type ChatMessageInput = z.input<typeof chatMessageInputSchema>;

export const chatMessageEditSchema = z.strictObject({
  body: messageBody,
  mentions: z.array(z.uuid({ error: 'That person was not found' })).max(20, 'Mention at most 20 people').default([]),
});
export type ChatMessageEdit = z.input<typeof chatMessageEditSchema>;

export const chatHideSchema = z.strictObject({
  reason: z.string().trim().min(3, 'Say why, in a few words').max(500, 'Keep the reason under 500 characters'),
});
export type ChatHideInput = z.infer<typeof chatHideSchema>;

export const chatMuteSchema = z.strictObject({
  userId: z.uuid({ error: 'That person was not found' }),
  minutes: z.coerce.number().int().min(5, 'Mute for at least 5 minutes').max(60 * 24 * 30, 'Mute for at most 30 days'),
  reason: z.string().trim().min(3, 'Say why, in a few words').max(500, 'Keep the reason under 500 characters'),
});
export type ChatMuteInput = z.infer<typeof chatMuteSchema>;

export const chatTopicSchema = z.strictObject({
  title: z.string().trim().min(3, 'Give the topic a title of at least 3 characters').max(120, 'Keep the title under 120 characters'),
});
export type ChatTopicInput = z.infer<typeof chatTopicSchema>;

const seq = z.coerce.number().int().min(0).max(Number.MAX_SAFE_INTEGER);

/** History pages backwards from `before` (a message's seq); `after` asks what was missed since a seq. */
export const chatMessagesQuerySchema = z
  .strictObject({
    before: seq.optional(),
    after: seq.optional(),
    limit: z.coerce.number().int().min(1).max(200).default(CHAT_PAGE_SIZE),
  })
  .refine((q) => q.before === undefined || q.after === undefined, { message: 'Ask for messages before or after, not both', path: ['after'] });
export type ChatMessagesQuery = z.infer<typeof chatMessagesQuerySchema>;

export const chatReadSchema = z.strictObject({ seq });
export type ChatReadInput = z.infer<typeof chatReadSchema>;

export const chatSearchQuerySchema = z.strictObject({
  q: z.string().trim().min(2, 'Search for at least 2 characters').max(200, 'Search for at most 200 characters'),
  limit: z.coerce.number().int().min(1).max(50).default(20),
});
export type ChatSearchQuery = z.infer<typeof chatSearchQuerySchema>;

export const chatPeopleQuerySchema = z.strictObject({
  q: z.string().trim().max(60).default(''),
});

export interface ChatPersonDto {
  id: string;
  name: string;
  farmName: string | null;
}

export interface ChatReactionDto {
  reaction: ChatReaction;
  userIds: string[];
}

export interface ChatReplyDto {
  id: string;
  authorName: string;
  /** The start of the quoted text; null once it was removed or hidden. */
  excerpt: string | null;
}

/** A photo of a message, served only to who may read its thread. */
export interface ChatAttachmentDto {
  id: string;
  url: string;
  thumbnailUrl: string;
  width: number;
  height: number;
}

export interface ChatMessageDto {
  id: string;
  clientId: string;
  threadId: string;
  /** The thread's order: later messages have larger numbers. */
  seq: number;
  author: { id: string; name: string; farmId: string | null; farmName: string | null };
  /** Null once removed by its author or hidden by the admin. */
  body: string | null;
  state: 'visible' | 'deleted' | 'hidden';
  /** Shown to the author and the admins only. */
  hiddenReason: string | null;
  mentions: { id: string; name: string }[];
  replyTo: ChatReplyDto | null;
  reactions: ChatReactionDto[];
  /** Its photos (none once removed or hidden). */
  attachments: ChatAttachmentDto[];
  createdAt: string;
  editedAt: string | null;
}

export interface ChatThreadDto {
  id: string;
  kind: ChatThreadKind;
  subjectType: string | null;
  subjectId: string | null;
  title: string;
  /** Where the subject lives in the app (a processing day's page); null for the channel and topics. */
  link: string | null;
  lastMessageAt: string | null;
  lastSeq: number;
  /** The person's read position: messages after it are unread. */
  readSeq: number;
  /** Unread messages by others, counted up to 100. */
  unread: number;
  lastMessage: { authorName: string; excerpt: string } | null;
  /** Set while the person is muted in the co-op's channel and topics. */
  mutedUntil: string | null;
}

export interface ChatThreadListDto {
  items: ChatThreadDto[];
  totalUnread: number;
}

export interface ChatMessagePageDto {
  items: ChatMessageDto[];
  /** More older messages exist (paging backwards) or newer ones (catching up). */
  hasMore: boolean;
}

export interface ChatSearchHitDto {
  message: ChatMessageDto;
  threadTitle: string;
  /** Words of the hit marked with « » by PostgreSQL's headline; plain text. */
  snippet: string;
}

export interface ChatMuteDto {
  userId: string;
  name: string;
  until: string;
  reason: string;
}
