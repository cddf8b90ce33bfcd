import { Link } from 'react-router-dom';
import { MessagesSquare } from 'lucide-react';
import { Card } from '../../../components/ui/card';
import { useChatThreads } from '../api/chat-api';

/** For the Co-op hub: unread messages in total and the liveliest unread thread, with the way in. */
export function ChatSummary() {
  const threads = useChatThreads();
  const total = threads.data?.totalUnread ?? 0;
  const next = threads.data?.items.find((t) => t.unread > 0) ?? threads.data?.items[0];
  return (
    <Card className="space-y-3">
      <h2 className="flex items-center gap-2 text-xl font-bold text-bark">
        <MessagesSquare className="size-6 text-moss" aria-hidden="true" /> Co-op Chat
      </h2>
      {threads.isPending ? (
        <p className="text-grey-600">Loading…</p>
      ) : (
        <p className="text-grey-700">
          {total === 0 ? 'You are up to date.' : `${total >= 100 ? '99+' : total} unread ${total === 1 ? 'message' : 'messages'}`}
          {next?.lastMessage && total > 0 && (
            <span className="block truncate text-sm text-grey-600">
              {next.title} — {next.lastMessage.authorName}: {next.lastMessage.excerpt}
            </span>
          )}
        </p>
      )}
      <Link to={next && total > 0 ? `/chat/${next.id}` : '/chat'} className="inline-flex min-h-11 items-center rounded-lg bg-moss px-4 font-semibold text-white hover:bg-moss-deep">
        {total > 0 ? 'Read them' : 'Open the chat'}
      </Link>
    </Card>
  );
}
