import { useSyncExternalStore } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { ChevronLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { PageTitle } from '../../components/ui/page-title';
import { ChatSearch, ChatThread, ThreadList, useChatThreads } from '../../features/chat';
import { chatThreadsQueryOptions } from '../../features/chat/api/chat-api';

const wide = typeof window === 'undefined' ? null : window.matchMedia('(min-width: 1024px)');
/** From 1024 px the list and a thread share the screen (the Tailwind `lg` step). */
function useWideScreen(): boolean {
  return useSyncExternalStore(
    (changed) => {
      wide?.addEventListener('change', changed);
      return () => wide?.removeEventListener('change', changed);
    },
    () => wide?.matches ?? false,
  );
}

export async function loader() {
  await queryClient.ensureQueryData(chatThreadsQueryOptions());
  return null;
}

/**
 * /chat and /chat/:threadId: the co-op's conversation. On a phone the list and a thread are two screens;
 * from 1024 px the list sits beside the open thread (the channel when none is chosen).
 */
export function ChatPage() {
  const { threadId } = useParams();
  const navigate = useNavigate();
  const threads = useChatThreads();
  const [search] = useSearchParams();
  const isWide = useWideScreen();
  // On a phone the list alone shows at /chat: no thread is opened (and so none is marked read) unseen.
  const shown = threadId ?? (isWide ? (threads.data?.items[0]?.id ?? null) : null);
  const title = threads.data?.items.find((t) => t.id === shown)?.title;
  return (
    <div className="space-y-4">
      <PageTitle>{threadId && title ? `${title} · Co-op Chat` : 'Co-op Chat'}</PageTitle>
      <div className={threadId ? 'hidden lg:block' : ''}>
        <h1 className="text-3xl font-bold tracking-tight text-bark">Co-op Chat</h1>
        <p className="text-lg text-grey-600">The co-op talks here: the channel, topics, and the threads beside litters, days and loans.</p>
      </div>
      <div className="lg:grid lg:grid-cols-[20rem_minmax(0,1fr)] lg:gap-6">
        <aside className={threadId ? 'hidden space-y-4 lg:block' : 'space-y-4'} aria-label="Threads and search">
          <ChatSearch />
          <ThreadList onStarted={(thread) => void navigate(`/chat/${thread.id}`)} />
        </aside>
        <div className={threadId ? 'min-w-0 space-y-2' : 'hidden min-w-0 lg:block'}>
          {threadId && (
            <Link to="/chat" className="inline-flex min-h-11 items-center gap-1 font-semibold text-moss-deep lg:hidden">
              <ChevronLeft className="size-5" aria-hidden="true" /> All threads
            </Link>
          )}
          {shown && <ChatThread key={shown} threadId={shown} embedded={false} focusMessageId={search.get('message') ?? undefined} />}
        </div>
      </div>
    </div>
  );
}
