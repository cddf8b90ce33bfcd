import { Fragment, useCallback, useEffect, useLayoutEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { ArrowDown, ExternalLink, Radio } from 'lucide-react';
import { subjectOf, type ChatMessageDto, type ChatThreadDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Spinner } from '../../../components/ui/spinner';
import { useAbility } from '../../../lib/ability';
import { cn } from '../../../lib/cn';
import { useSession } from '../../../lib/session';
import { useChatThread, useSubjectThread } from '../api/chat-api';
import { useLiveThread } from '../hooks/use-live-thread';
import { Composer } from './composer';
import { MessageItem, PendingItem } from './message-item';

const dayLabel = new Intl.DateTimeFormat(undefined, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' });
const dayKey = (iso: string) => new Date(iso).toDateString();
const NEAR_BOTTOM = 80;

function DaySeparator({ iso }: { iso: string }) {
  const today = new Date().toDateString();
  const yesterday = new Date(Date.now() - 86_400_000).toDateString();
  const key = dayKey(iso);
  const label = key === today ? 'Today' : key === yesterday ? 'Yesterday' : dayLabel.format(new Date(iso));
  return (
    <li className="my-2 flex justify-center" role="separator" aria-label={label}>
      <span className="rounded-full bg-grey-100 px-3 py-0.5 text-sm font-semibold text-grey-700">{label}</span>
    </li>
  );
}

interface ThreadViewProps {
  thread: ChatThreadDto;
  embedded: boolean;
  /** A message to bring into view once loaded (a mention's or a search hit's link). */
  focusMessageId?: string;
}

function ThreadView({ thread, embedded, focusMessageId }: ThreadViewProps) {
  const me = useSession();
  const ability = useAbility();
  const moderates = ability.can('moderate', subjectOf('ChatMessage', { coopId: me.coop.id }));
  const live = useLiveThread(thread.id, me.user.id);
  const [replyTo, setReplyTo] = useState<ChatMessageDto | null>(null);
  // Where the person had read to when the thread opened: the "New messages" line stays there while reading.
  const [openedAt] = useState(thread.readSeq);
  const scroller = useRef<HTMLDivElement>(null);
  const stick = useRef(true);
  const lastRead = useRef(thread.readSeq);
  const { messages, pending, readUpTo } = live;
  const firstUnread = messages.find((m) => m.seq > openedAt && m.author.id !== me.user.id && m.state === 'visible');
  const unreadCount = messages.filter((m) => m.seq > openedAt && m.author.id !== me.user.id && m.state === 'visible').length;
  const lastSeq = messages.at(-1)?.seq ?? 0;

  const markIfAtBottom = useCallback(() => {
    const el = scroller.current;
    // A thread not on screen (display: none) has read nothing.
    if (!el || el.clientHeight === 0) return;
    const atBottom = el.scrollHeight - el.scrollTop - el.clientHeight < NEAR_BOTTOM;
    stick.current = atBottom;
    if (atBottom && lastSeq > lastRead.current && document.visibilityState === 'visible') {
      lastRead.current = lastSeq;
      void readUpTo(lastSeq).catch(() => {
        lastRead.current = 0;
      });
    }
  }, [lastSeq, readUpTo]);

  // Follow new messages while the reader is at the bottom (and always for one's own).
  useLayoutEffect(() => {
    const el = scroller.current;
    if (el && (stick.current || pending.length > 0)) el.scrollTop = el.scrollHeight;
    markIfAtBottom();
  }, [messages.length, pending.length, markIfAtBottom]);

  // The box and its photos and web font settle after the first layout: stay at the bottom while the reader is there.
  useEffect(() => {
    const el = scroller.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    const keep = new ResizeObserver(() => {
      if (stick.current) el.scrollTop = el.scrollHeight;
    });
    keep.observe(el);
    for (const child of el.children) keep.observe(child);
    return () => keep.disconnect();
  }, []);

  const focused = useRef(false);
  useEffect(() => {
    if (!focusMessageId || focused.current || !messages.some((m) => m.id === focusMessageId)) return;
    focused.current = true;
    stick.current = false;
    const el = document.getElementById(`message-${focusMessageId}`);
    el?.scrollIntoView({ block: 'center' });
    el?.querySelector('article')?.classList.add('ring-2', 'ring-straw');
  }, [focusMessageId, messages]);

  useEffect(() => {
    const onVisible = () => markIfAtBottom();
    document.addEventListener('visibilitychange', onVisible);
    return () => document.removeEventListener('visibilitychange', onVisible);
  }, [markIfAtBottom]);

  const jumpToFirstUnread = async () => {
    // Older pages until the first unread is loaded (at most a few thousand messages back).
    for (let i = 0; i < 40 && live.hasOlder && (messages[0]?.seq ?? 0) > openedAt + 1 && !firstUnread; i++) await live.loadOlder();
    stick.current = false;
    requestAnimationFrame(() => document.getElementById('first-unread')?.scrollIntoView({ block: 'start' }));
  };

  return (
    <section aria-label={thread.title} className={cn('flex flex-col rounded-2xl border border-grey-200 bg-white', embedded ? '' : 'min-h-0')}>
      <header className="flex flex-wrap items-center justify-between gap-2 border-b border-grey-200 px-3 py-2">
        <div className="min-w-0">
          <h2 className="truncate text-lg font-bold text-bark">{thread.title}</h2>
          <p className="flex items-center gap-1 text-sm text-grey-600" aria-live="polite">
            <Radio className={cn('size-4', live.live ? 'text-moss' : 'text-grey-400')} aria-hidden="true" />
            {live.live ? 'Live' : 'Connecting…'}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {unreadCount > 0 && (
            <button type="button" onClick={() => void jumpToFirstUnread()} className="inline-flex min-h-11 items-center gap-1 rounded-lg border-2 border-moss px-3 font-semibold text-moss-deep">
              <ArrowDown className="size-4" aria-hidden="true" /> First unread ({unreadCount})
            </button>
          )}
          {thread.link && !embedded && (
            <Link to={thread.link} className="inline-flex min-h-11 items-center gap-1 rounded-lg px-3 font-semibold text-moss-deep underline-offset-4 hover:underline">
              <ExternalLink className="size-4" aria-hidden="true" /> Open
            </Link>
          )}
        </div>
      </header>
      <div
        ref={scroller}
        onScroll={markIfAtBottom}
        className={cn('overflow-y-auto overscroll-contain px-1', embedded ? 'h-96' : 'h-[calc(100dvh-19rem)] min-h-72 lg:h-[calc(100dvh-17rem)]')}
        data-testid="chat-messages"
      >
        {live.state === 'loading' && (
          <div className="flex justify-center p-6"><Spinner /></div>
        )}
        {live.state === 'error' && <Alert tone="error" title="Messages not loaded" className="m-3">Check the connection and reload the page.</Alert>}
        {live.hasOlder && (
          <div className="flex justify-center p-2">
            <button type="button" onClick={() => { stick.current = false; void live.loadOlder(); }} className="min-h-11 rounded-lg px-4 font-semibold text-moss-deep hover:bg-moss-wash">
              Show older messages
            </button>
          </div>
        )}
        {live.state === 'ready' && messages.length === 0 && pending.length === 0 && (
          <p className="p-6 text-center text-grey-600">No messages yet. Say hello.</p>
        )}
        <ol className="space-y-1 pb-2" aria-label="Messages">
          {messages.map((message, i) => (
            <Fragment key={message.id}>
              {(i === 0 || dayKey(messages[i - 1]!.createdAt) !== dayKey(message.createdAt)) && <DaySeparator iso={message.createdAt} />}
              <MessageItem
                message={message}
                myId={me.user.id}
                myName={me.user.name}
                moderates={moderates}
                firstUnread={message.id === firstUnread?.id}
                onReply={setReplyTo}
                onChanged={(changed) => live.take([changed])}
              />
            </Fragment>
          ))}
          {pending.map((message) => (
            <PendingItem key={message.clientId} message={message} myName={me.user.name} onRetry={() => live.retry(message.clientId)} onDiscard={() => live.discard(message.clientId)} />
          ))}
        </ol>
      </div>
      {thread.mutedUntil ? (
        <p className="border-t border-grey-200 bg-clay-wash p-3 text-clay-deep">
          The admin muted you in the co-op's channel until {new Date(thread.mutedUntil).toLocaleString()}.
        </p>
      ) : (
        <Composer
          threadId={thread.id}
          replyTo={replyTo}
          onCancelReply={() => setReplyTo(null)}
          sticky={!embedded}
          onSend={(body, mentions, photos) => {
            stick.current = true;
            live.send(body, mentions, replyTo, photos);
            setReplyTo(null);
          }}
        />
      )}
    </section>
  );
}

export type ChatThreadProps =
  | { threadId: string; subject?: never; embedded?: boolean; focusMessageId?: string }
  | { subject: { type: string; id: string }; threadId?: never; embedded?: boolean; focusMessageId?: never };

function ThreadById({ threadId, embedded, focusMessageId }: { threadId: string; embedded: boolean; focusMessageId?: string }) {
  const thread = useChatThread(threadId);
  if (thread.isPending) return <div className="flex justify-center p-6"><Spinner /></div>;
  if (thread.isError) return <Alert tone="error" title="Thread not found">It may have been another co-op's, or you may not read it.</Alert>;
  return <ThreadView key={thread.data.id} thread={thread.data} embedded={embedded} focusMessageId={focusMessageId} />;
}

function ThreadOfSubject({ type, id, embedded }: { type: string; id: string; embedded: boolean }) {
  const thread = useSubjectThread(type, id);
  if (thread.isPending) return <div className="flex justify-center p-6"><Spinner /></div>;
  if (thread.isError) return <Alert tone="error" title="No conversation here">You may not read this thread.</Alert>;
  return <ThreadById threadId={thread.data.id} embedded={embedded} />;
}

/**
 * A live chat thread: by its id, or beside a subject (`{ type: 'processing-day', id }`), whose thread is made
 * the first time it is opened. `embedded` keeps it in a box of its own height for another page.
 */
export function ChatThread(props: ChatThreadProps) {
  const embedded = props.embedded ?? Boolean(props.subject);
  if (props.subject) return <ThreadOfSubject type={props.subject.type} id={props.subject.id} embedded={embedded} />;
  return <ThreadById threadId={props.threadId} embedded={embedded} focusMessageId={props.focusMessageId} />;
}
