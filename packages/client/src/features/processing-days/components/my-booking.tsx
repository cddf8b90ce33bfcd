import { useState } from 'react';
import { BellRing } from 'lucide-react';
import type { BookingDto, ProcessingDayDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant } from '../../../lib/dates';
import { formatDate } from '../../../lib/days';
import { errorText } from '../../../lib/form-errors';
import { useMoney } from '../../../lib/money';
import { useCandidates } from '../api/get-processing-days';
import { useCancelBooking, useConfirmBooking } from '../api/processing-day-mutations';
import { bookingStatusLabels, bookingStatusTone } from '../processing-days-format';
import { BookingForm } from './booking-form';

interface MyBookingProps {
  day: ProcessingDayDto;
  /** The farm's live bookings on the day (not cancelled): usually one, or one booked and more head waiting. */
  bookings: BookingDto[];
  farmId: string | null;
}

/** The reader's farm on this day: book, see her place or her turn on the waiting list, confirm an offered place, change or cancel. */
export function MyBooking({ day, bookings, farmId }: MyBookingProps) {
  const [adding, setAdding] = useState(false);
  const wantsForm = day.canBook && (bookings.length === 0 || adding);
  const candidates = useCandidates(day.id, farmId, wantsForm);

  if (!farmId) return null;
  return (
    <Card className="space-y-4" data-testid="my-booking">
      <h2 className="text-xl font-bold">{bookings.length > 1 ? 'My bookings' : 'My booking'}</h2>
      {bookings.map((booking) => <BookingBlock key={booking.id} day={day} booking={booking} farmId={farmId} />)}
      {bookings.length === 0 && !day.canBook && <p className="text-grey-700">{day.deadlinePassed ? `Sign-up closed on ${formatDate(day.signUpDeadline)}.` : 'Booking is not open to you.'}</p>}
      {bookings.length > 0 && day.canBook && !adding && <Button variant="quiet" onClick={() => setAdding(true)}>Book more head</Button>}
      {wantsForm && (candidates.isPending ? (
        <Spinner />
      ) : candidates.isError ? (
        <Alert tone="error">{errorText(candidates.error)}</Alert>
      ) : (
        <>
          {bookings.length === 0 && <p className="text-grey-700">Choose what you bring, ready by the day first. Book by {formatDate(day.signUpDeadline)}.</p>}
          <BookingForm dayId={day.id} farmId={farmId} candidates={candidates.data.items} freeHead={day.capacity.freeHead} onDone={adding ? () => setAdding(false) : undefined} />
        </>
      ))}
    </Card>
  );
}

/** One booking of the farm: its head and lines, its place in line, an offer to confirm, change and cancel. */
function BookingBlock({ day, booking, farmId }: { day: ProcessingDayDto; booking: BookingDto; farmId: string }) {
  const [changing, setChanging] = useState(false);
  const [cancelling, setCancelling] = useState(false);
  const money = useMoney();
  const confirm = useConfirmBooking(day.id);
  const cancel = useCancelBooking(day.id);
  const candidates = useCandidates(day.id, farmId, changing);
  return (
    <div className="space-y-3 border-t border-grey-200 pt-3 first-of-type:border-t-0 first-of-type:pt-0" data-testid={`my-booking-${booking.status}`}>
      <Badge tone={bookingStatusTone[booking.status]}>{bookingStatusLabels[booking.status]}</Badge>

      {booking.status === 'offered' && (
        <div className="space-y-3 rounded-xl border-2 border-clay bg-clay-wash p-4" data-testid="offered-place">
          <p className="flex items-start gap-2 text-lg font-bold text-clay-deep">
            <BellRing className="mt-1 size-5 shrink-0" aria-hidden="true" />
            A place is free for your {booking.head} head.
          </p>
          {booking.offerExpiresAt && <p className="font-medium">Confirm by {formatInstant(booking.offerExpiresAt)}, or it passes to the next farm waiting.</p>}
          {booking.canConfirm && (
            <Button className="min-h-14 w-full text-lg sm:w-auto" isBusy={confirm.isPending} onClick={() => confirm.mutate({ bookingId: booking.id, version: booking.version })}>
              Confirm my place
            </Button>
          )}
          {confirm.isError && <Alert tone="error">{errorText(confirm.error)}</Alert>}
        </div>
      )}

      {!changing && (
        <div className="space-y-2">
          <p className="text-3xl font-bold tabular-nums" data-testid="my-booking-head">
            {booking.head} head
            {booking.status === 'waitlisted' && booking.waitlistPosition !== null && (
              <span className="ml-2 text-lg font-semibold text-bark" data-testid="waitlist-position">· {booking.waitlistPosition === 1 ? 'next in line' : `number ${booking.waitlistPosition} in line`}</span>
            )}
          </p>
          <ul className="text-grey-700">
            {booking.lines.map((l) => <li key={l.groupId ?? l.animalId}>{l.label}: {l.head}</li>)}
          </ul>
          {booking.feeCents !== undefined && booking.status !== 'waitlisted' && <p className="text-grey-700">Fee {money(booking.feeCents)}{day.status === 'closed' ? '' : ', charged after the day for the head processed'}.</p>}
          {booking.status === 'waitlisted' && <p className="text-grey-700">You are told at once, by notice and e-mail, when a place frees up.</p>}
          {booking.headBrought !== null && <p className="font-medium">Checked in: {booking.headBrought} head brought.</p>}
        </div>
      )}

      {!changing && (booking.canChange || booking.canCancel) && !cancelling && (
        <div className="flex flex-wrap gap-3">
          {booking.canChange && booking.status !== 'offered' && <Button variant="secondary" onClick={() => setChanging(true)}>Change head</Button>}
          {booking.canCancel && <Button variant="secondary" className="border-clay text-clay-deep hover:bg-clay-wash" onClick={() => setCancelling(true)}>Cancel booking</Button>}
        </div>
      )}
      {cancelling && (
        <div className="space-y-3 rounded-xl border-2 border-clay p-4">
          <p className="font-semibold">Cancel your {booking.head} head{booking.status === 'waitlisted' ? ' on the waiting list' : ''}? The place goes to the next farm waiting.</p>
          <div className="flex flex-wrap gap-3">
            <Button variant="danger" isBusy={cancel.isPending} onClick={() => cancel.mutate({ bookingId: booking.id, version: booking.version, reason: '' }, { onSuccess: () => setCancelling(false) })}>
              Yes, cancel
            </Button>
            <Button variant="quiet" onClick={() => setCancelling(false)}>Keep it</Button>
          </div>
          {cancel.isError && <Alert tone="error">{errorText(cancel.error)}</Alert>}
        </div>
      )}
      {!booking.canChange && !booking.canCancel && day.deadlinePassed && day.status === 'scheduled' && (
        <p className="text-grey-700">Sign-up closed on {formatDate(day.signUpDeadline)}: changes now go through the co-op's admin.</p>
      )}

      {changing && (candidates.isPending ? (
        <Spinner />
      ) : candidates.isError ? (
        <Alert tone="error">{errorText(candidates.error)}</Alert>
      ) : (
        <BookingForm key={booking.version} dayId={day.id} farmId={farmId} candidates={candidates.data.items} freeHead={day.capacity.freeHead} booking={booking} onDone={() => setChanging(false)} />
      ))}
    </div>
  );
}
