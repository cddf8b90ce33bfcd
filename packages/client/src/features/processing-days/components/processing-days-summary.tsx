import { CalendarDays } from 'lucide-react';
import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { formatDate, formatLongDay } from '../../../lib/days';
import { useDays } from '../api/get-processing-days';

/** For the Co-op hub: the next processing day and the one thing to do about it (confirm, book, or just be there). */
export function ProcessingDaysSummary() {
  const { data } = useDays('upcoming');
  const next = data?.items.find((d) => d.status === 'scheduled');
  const offered = data?.items.find((d) => d.myBookings.some((b) => b.status === 'offered'));
  const day = offered ?? next;
  const mine = day?.myBookings[0];
  const todo = !day
    ? 'No processing day is scheduled.'
    : mine?.status === 'offered'
      ? `A place is free for your ${mine.head} head: confirm it now.`
      : mine?.status === 'booked'
        ? `You bring ${mine.head} head.`
        : mine?.status === 'waitlisted'
          ? `You are on the waiting list with ${mine.head} head.`
          : day.deadlinePassed
            ? 'Sign-up is closed.'
            : day.capacity.freeHead > 0
              ? `${day.capacity.freeHead} places free: book by ${formatDate(day.signUpDeadline)}.`
              : 'Full: join the waiting list.';
  return (
    <Card className="relative space-y-2" data-testid="processing-days-summary">
      <h2 className="flex items-center gap-2 text-lg font-bold">
        <CalendarDays className="size-5 text-moss" aria-hidden="true" />
        <Link to={day ? `/processing-days/${day.id}` : '/processing-days'} className="after:absolute after:inset-0 after:rounded-2xl after:content-['']">
          Processing days
        </Link>
      </h2>
      {day && <p className="text-xl font-semibold">{formatLongDay(day.date)} · {day.siteName}</p>}
      <p className={mine?.status === 'offered' ? 'font-semibold text-clay-deep' : 'text-grey-700'}>{todo}</p>
    </Card>
  );
}
