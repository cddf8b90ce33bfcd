import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { X } from 'lucide-react';
import { notificationKeys } from '../api/keys';

export interface LatestNotification {
  title: string;
  link: string;
  at: number;
}

const SHOWN_MS = 10_000;

/** The latest notification that arrived live, shown for a few seconds above the phone bar; the bell keeps it after. */
export function NotificationToast() {
  const queryClient = useQueryClient();
  const { data: latest } = useQuery<LatestNotification | null>({ queryKey: notificationKeys.latest(), queryFn: () => null, enabled: false, staleTime: Infinity });
  const dismiss = () => queryClient.setQueryData(notificationKeys.latest(), null);
  useEffect(() => {
    if (!latest) return;
    const timer = setTimeout(() => queryClient.setQueryData(notificationKeys.latest(), null), SHOWN_MS);
    return () => clearTimeout(timer);
  }, [latest, queryClient]);
  return (
    <div role="status" aria-live="polite" className="pointer-events-none fixed inset-x-0 bottom-20 z-30 flex justify-center px-4 lg:bottom-6">
      {latest && (
        <div className="pointer-events-auto flex max-w-md items-center gap-2 rounded-xl bg-bark py-2 pr-2 pl-4 text-oat shadow-lg">
          <Link to={latest.link} onClick={dismiss} className="min-h-11 flex-1 py-2.5 font-medium underline-offset-2 hover:underline">
            {latest.title}
          </Link>
          <button type="button" onClick={dismiss} className="inline-flex size-11 shrink-0 items-center justify-center rounded-lg hover:bg-black/20">
            <X className="size-5" aria-hidden="true" />
            <span className="sr-only">Dismiss</span>
          </button>
        </div>
      )}
    </div>
  );
}
