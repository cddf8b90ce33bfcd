import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Pagination } from '../../../components/ui/data-table';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant } from '../../../lib/dates';
import { cn } from '../../../lib/cn';
import { useNotifications } from '../api/get-notifications';
import { useMarkAllRead, useMarkRead } from '../api/notification-mutations';

const PAGE_SIZE = 20;

/** The bell's list: newest first; opening an entry marks it read and goes to what it is about. */
export function NotificationList() {
  const [page, setPage] = useState(1);
  const [show, setShow] = useState<'all' | 'unread'>('all');
  const { data, error, isPending } = useNotifications(page, PAGE_SIZE, show === 'unread');
  const markRead = useMarkRead();
  const markAll = useMarkAllRead();
  const navigate = useNavigate();

  if (isPending) return <Spinner label="Loading notifications" />;
  if (error) return <Alert tone="error">{error.message}</Alert>;
  const open = (id: string, link: string, unread: boolean) => {
    if (unread) markRead.mutate(id);
    void navigate(link);
  };
  return (
    <section aria-labelledby="notification-list" className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="notification-list" className="sr-only">Notifications</h2>
        <SegmentedFilter
          label="Show"
          value={show}
          onChange={(value) => { setShow(value); setPage(1); }}
          options={[{ value: 'all', label: 'All', count: data.total }, { value: 'unread', label: 'Unread', count: data.unread }]}
        />
        <Button variant="secondary" onClick={() => markAll.mutate()} disabled={data.unread === 0} isBusy={markAll.isPending}>
          Mark all read
        </Button>
      </div>
      {data.items.length === 0 ? (
        <p className="rounded-2xl border border-dashed border-grey-300 p-6 text-center text-grey-600">
          {show === 'unread' ? 'Nothing unread.' : 'Nothing yet. Requests, answers and news from the co-op land here.'}
        </p>
      ) : (
        <ul className="divide-y divide-grey-200 overflow-hidden rounded-2xl border border-grey-200 bg-white">
          {data.items.map((item) => {
            const unread = item.readAt === null;
            return (
              <li key={item.id}>
                <Link
                  to={item.link}
                  onClick={(event) => { event.preventDefault(); open(item.id, item.link, unread); }}
                  className={cn('flex min-h-14 items-start gap-3 px-4 py-3 hover:bg-oat focus-visible:outline-moss', unread && 'bg-straw-wash/60')}
                >
                  <span aria-hidden="true" className={cn('mt-2 size-2.5 shrink-0 rounded-full', unread ? 'bg-clay' : 'bg-transparent')} />
                  <span className="min-w-0 flex-1">
                    <span className={cn('block', unread ? 'font-semibold text-bark' : 'text-grey-700')}>
                      {unread && <span className="sr-only">Unread: </span>}
                      {item.title}
                    </span>
                    {item.body && <span className="block text-sm text-grey-600">{item.body}</span>}
                    <span className="block text-sm text-grey-600">{formatInstant(item.createdAt)}</span>
                  </span>
                </Link>
              </li>
            );
          })}
        </ul>
      )}
      <Pagination page={page} pageSize={PAGE_SIZE} total={data.total} onPage={setPage} noun="notifications" />
    </section>
  );
}
