import { useState } from 'react';
import type { BookingDto, ProcessingDayDto, WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { TextLink } from '../../../components/ui/text-link';
import { errorText } from '../../../lib/form-errors';
import { useCheckIn } from '../api/processing-day-mutations';
import { bookingStatusLabels, bookingStatusTone } from '../processing-days-format';
import { YieldsForm } from './yields-form';

/** Head actually brought, counted at the gate by the host or the admin. */
function CheckIn({ dayId, booking }: { dayId: string; booking: BookingDto }) {
  const checkIn = useCheckIn(dayId);
  const [head, setHead] = useState(booking.headBrought ?? booking.head);
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" className="size-12 px-0 text-xl" aria-label="One fewer head brought" disabled={head <= 0} onClick={() => setHead(head - 1)}>−</Button>
        <input
          type="number" inputMode="numeric" min={0} value={head} onChange={(e) => setHead(Math.max(0, Number.parseInt(e.target.value, 10) || 0))}
          aria-label={`Head brought by ${booking.farmName}`} className="h-12 w-16 rounded-lg border-2 border-grey-500 text-center text-xl font-bold tabular-nums"
        />
        <Button variant="secondary" className="size-12 px-0 text-xl" aria-label="One more head brought" onClick={() => setHead(head + 1)}>+</Button>
        <Button isBusy={checkIn.isPending} onClick={() => checkIn.mutate({ bookingId: booking.id, version: booking.version, headBrought: head })}>
          {booking.headBrought === null ? 'Check in' : 'Correct'}
        </Button>
      </div>
      {checkIn.isError && <Alert tone="error">{errorText(checkIn.error)}</Alert>}
    </div>
  );
}

interface BookingsPanelProps {
  day: ProcessingDayDto;
  bookings: BookingDto[];
  unit: WeightUnit;
}

/**
 * Every farm booked for the day, in turn: head, status, check-in at the gate and, once checked in, the
 * yields of each batch (kept as the farm's processing records).
 */
export function BookingsPanel({ day, bookings, unit }: BookingsPanelProps) {
  const [yieldsOf, setYieldsOf] = useState<string | null>(null);
  const live = bookings.filter((b) => b.status !== 'cancelled');
  return (
    <Card className="space-y-4" data-testid="bookings">
      <h2 className="text-xl font-bold">Farms booked</h2>
      {live.length === 0 && <p className="text-grey-700">No bookings yet.</p>}
      <ul className="space-y-3">
        {live.map((b) => {
          // The yields name the farm's own group or animal, which only the farm itself is shown.
          const mayRecord = day.status === 'scheduled' && b.status === 'booked' && b.headBrought !== null && b.lines.length > 0 && b.lines.every((l) => l.groupId ?? l.animalId);
          return (
            <li key={b.id} className="space-y-3 rounded-xl border border-grey-200 p-3" data-testid={`booking-${b.farmId}`}>
              <div className="flex flex-wrap items-center justify-between gap-2">
                <p className="min-w-0 font-semibold">{b.farmName}</p>
                <span className="ml-auto flex items-center gap-2">
                  <span className="text-lg font-bold tabular-nums">{b.head}</span>
                  <Badge tone={bookingStatusTone[b.status]}>{b.status === 'waitlisted' && b.waitlistPosition !== null ? `Waiting · ${b.waitlistPosition}` : bookingStatusLabels[b.status]}</Badge>
                </span>
              </div>
              <p className="text-sm text-grey-700">{b.lines.map((l) => `${l.label}: ${l.head}`).join(' · ')}</p>
              {b.headBrought !== null && <p className="font-medium text-moss-deep">Checked in: {b.headBrought} head</p>}
              {b.canCheckIn && b.status === 'booked' && day.status === 'scheduled' && <CheckIn dayId={day.id} booking={b} />}
              {mayRecord && (yieldsOf === b.id ? (
                <div className="space-y-2 border-t border-grey-200 pt-3">
                  <YieldsForm dayId={day.id} booking={b} unit={unit} />
                  <Button variant="quiet" onClick={() => setYieldsOf(null)}>Done with yields</Button>
                </div>
              ) : (
                <Button variant="secondary" onClick={() => setYieldsOf(b.id)}>Record yields</Button>
              ))}
            </li>
          );
        })}
      </ul>
      <div className="text-sm text-grey-700">
        <p>Yields are kept as each farm's own processing records.</p>
        <TextLink to="/grow-out/processing">My farm's processing records</TextLink>
      </div>
    </Card>
  );
}
