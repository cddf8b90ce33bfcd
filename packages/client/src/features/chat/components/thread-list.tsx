import { useState } from 'react';
import { NavLink } from 'react-router-dom';
import { Hash, MessageSquare, Link2, Plus } from 'lucide-react';
import type { ChatThreadDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Spinner } from '../../../components/ui/spinner';
import { isApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { useChatThreads, useStartTopic } from '../api/chat-api';

const when = new Intl.DateTimeFormat(undefined, { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });

function UnreadBadge({ count }: { count: number }) {
  if (count === 0) return null;
  return (
    <span className="inline-flex min-w-6 shrink-0 items-center justify-center rounded-full bg-clay px-1.5 text-sm font-bold text-white">
      {count >= 100 ? '99+' : count}
      <span className="sr-only"> unread</span>
    </span>
  );
}

function ThreadIcon({ thread }: { thread: ChatThreadDto }) {
  const Icon = thread.kind === 'channel' ? Hash : thread.kind === 'topic' ? MessageSquare : Link2;
  return <Icon className="mt-0.5 size-5 shrink-0 text-moss" aria-hidden="true" />;
}

function NewTopic({ onStarted }: { onStarted: (thread: ChatThreadDto) => void }) {
  const [open, setOpen] = useState(false);
  const [title, setTitle] = useState('');
  const start = useStartTopic();
  if (!open) {
    return (
      <button type="button" onClick={() => setOpen(true)} className="inline-flex min-h-11 w-full items-center justify-center gap-2 rounded-lg border-2 border-moss bg-white px-4 font-semibold text-moss-deep hover:bg-moss-wash">
        <Plus className="size-5" aria-hidden="true" /> Start a topic
      </button>
    );
  }
  return (
    <form
      className="space-y-2 rounded-xl border border-grey-200 bg-white p-3"
      onSubmit={(e) => {
        e.preventDefault();
        start.mutate(title, {
          onSuccess: (thread) => {
            setTitle('');
            setOpen(false);
            onStarted(thread);
          },
        });
      }}
    >
      <label htmlFor="topic-title" className="block font-semibold">Topic title</label>
      <input id="topic-title" value={title} onChange={(e) => setTitle(e.target.value)} maxLength={120} placeholder="e.g. Heat this week" className="min-h-11 w-full rounded-lg border border-grey-300 px-3" />
      {start.isError && <p role="alert" className="text-sm text-clay-deep">{isApiError(start.error) ? start.error.message : 'Not started; try again'}</p>}
      <div className="flex gap-2">
        <button type="submit" disabled={start.isPending} className="min-h-11 rounded-lg bg-moss px-4 font-semibold text-white">Start</button>
        <button type="button" onClick={() => setOpen(false)} className="min-h-11 rounded-lg px-4 font-semibold text-moss-deep">Cancel</button>
      </div>
    </form>
  );
}

/** The channel first, then topics and the threads beside subjects, each with its unread count. */
export function ThreadList({ onStarted }: { onStarted: (thread: ChatThreadDto) => void }) {
  const threads = useChatThreads();
  if (threads.isPending) return <div className="flex justify-center p-6"><Spinner /></div>;
  if (threads.isError) return <Alert tone="error" title="Threads not loaded">Check the connection and reload.</Alert>;
  return (
    <div className="space-y-3">
      <NewTopic onStarted={onStarted} />
      <ul className="space-y-2" aria-label="Threads">
        {threads.data.items.map((thread) => (
          <li key={thread.id}>
            <NavLink
              to={`/chat/${thread.id}`}
              className={({ isActive }) =>
                cn('flex min-h-11 gap-2 rounded-xl border px-3 py-2', isActive ? 'border-moss bg-moss-wash' : 'border-grey-200 bg-white hover:bg-grey-50')
              }
            >
              <ThreadIcon thread={thread} />
              <span className="min-w-0 flex-1">
                <span className="flex items-center justify-between gap-2">
                  <span className={cn('truncate', thread.unread > 0 ? 'font-bold text-bark' : 'font-semibold text-grey-700')}>{thread.title}</span>
                  <UnreadBadge count={thread.unread} />
                </span>
                {thread.lastMessage ? (
                  <span className="block truncate text-sm text-grey-600">
                    {thread.lastMessage.authorName}: {thread.lastMessage.excerpt}
                  </span>
                ) : (
                  <span className="block text-sm text-grey-500">No messages yet</span>
                )}
                {thread.lastMessageAt && <span className="block text-xs text-grey-500">{when.format(new Date(thread.lastMessageAt))}</span>}
              </span>
            </NavLink>
          </li>
        ))}
      </ul>
    </div>
  );
}
