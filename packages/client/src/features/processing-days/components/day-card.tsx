import type { ProcessingDayListItemDto } from '@burrowline/shared';
import { CalendarDays, Clock, MapPin } from 'lucide-react';
import { Link } from 'react-router-dom';
import { Badge } from '../../../components/ui/badge';
import { formatDate, formatLongDay } from '../../../lib/days';
import { bookingStatusLabels, bookingStatusTone } from '../processing-days-format';

/** An upcoming day as a card: when, where, how full, and the reader's own booking. The whole card is the link. */
export function DayCard({ day }: { day: ProcessingDayListItemDto }) {
  const c = day.capacity;
  const taken = c.bookedHead + c.offeredHead;
  const mine = day.myBookings[0];
  return (
    <li className="relative flex flex-col gap-3 rounded-2xl border border-grey-200 bg-white p-4 shadow-sm" data-testid={`day-card-${day.id}`}>
      <div className="flex items-start justify-between gap-3">
        <h3 className="min-w-0 text-xl font-bold text-bark">
          <Link to={`/processing-days/${day.id}`} className="after:absolute after:inset-0 after:rounded-2xl after:content-['']">
            <CalendarDays className="mr-1.5 inline size-5 align-[-3px] text-moss" aria-hidden="true" />
            {formatLongDay(day.date)}
          </Link>
        </h3>
        {day.status === 'cancelled' ? <Badge tone="clay">Cancelled</Badge> : mine && <Badge tone={bookingStatusTone[mine.status]}>{bookingStatusLabels[mine.status]}{mine.status !== 'waitlisted' ? ` · ${mine.head}` : ''}</Badge>}
      </div>
      <p className="flex flex-wrap gap-x-4 gap-y-1 text-grey-700">
        <span className="inline-flex items-center gap-1.5"><Clock className="size-4" aria-hidden="true" />{day.startTime}</span>
        <span className="inline-flex min-w-0 items-center gap-1.5"><MapPin className="size-4 shrink-0" aria-hidden="true" />{day.siteName}, {day.hostFarmName}</span>
      </p>
      <div className="space-y-1">
        <div className="flex h-3 overflow-hidden rounded-full bg-grey-100" aria-hidden="true">
          <div className="h-full bg-moss" style={{ width: `${Math.min(100, (taken / Math.max(1, c.capacityHead)) * 100)}%` }} />
        </div>
        <p className="text-sm text-grey-700">
          <strong className="text-bark">{c.freeHead === 0 ? 'Full' : `${c.freeHead} free`}</strong> of {c.capacityHead}
          {c.waitlistedHead > 0 && ` · ${c.waitlistedHead} waiting`}
          {' · '}
          {day.deadlinePassed ? 'Sign-up closed' : `Book by ${formatDate(day.signUpDeadline)}`}
        </p>
      </div>
    </li>
  );
}
