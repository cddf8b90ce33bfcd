import { Minus, Plus, Timer, TriangleAlert } from 'lucide-react';
import { useFieldArray, useForm } from 'react-hook-form';
import { bookingCreateSchema, type BookingCandidateDto, type BookingCreateInput, type BookingDto, type BookingItem } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { formatDate } from '../../../lib/days';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useBook, useChangeBooking } from '../api/processing-day-mutations';

interface Values {
  idempotencyKey: string;
  lines: { head: string }[];
}

const keyOf = (c: { groupId: string | null; animalId: string | null }) => c.groupId ?? c.animalId ?? '';

function itemsOf(candidates: BookingCandidateDto[], values: Values): BookingItem[] {
  return candidates.flatMap((c, i): BookingItem[] => {
    const head = Number.parseInt(values.lines[i]?.head ?? '0', 10) || 0;
    if (head <= 0) return [];
    return c.groupId ? [{ groupId: c.groupId, head }] : [{ animalId: c.animalId! }];
  });
}

interface BookingFormProps {
  dayId: string;
  farmId: string;
  candidates: BookingCandidateDto[];
  freeHead: number;
  /** Changing a booking: its lines fill the form and the change is sent with its version. */
  booking?: BookingDto;
  onDone?: () => void;
}

/**
 * Booking head for the day from the farm's grow-out groups and culls, those projected to reach target by the
 * day first. Animals under a medicine withdrawal on the day cannot be chosen; the date they may go is shown.
 */
export function BookingForm({ dayId, farmId, candidates, freeHead, booking, onDone }: BookingFormProps) {
  const book = useBook(dayId);
  const change = useChangeBooking(dayId);
  const headOf = (c: BookingCandidateDto) => String(booking?.lines.find((l) => (l.groupId ?? l.animalId) === keyOf(c))?.head ?? 0);
  const form = useForm<Values, unknown, BookingCreateInput>({
    resolver: sharedSchemaResolver(bookingCreateSchema, (v) => ({ idempotencyKey: v.idempotencyKey, farmId, items: itemsOf(candidates, v) }), () => null),
    defaultValues: { idempotencyKey: newIdempotencyKey(), lines: candidates.map((c) => ({ head: headOf(c) })) },
  });
  const lines = useFieldArray({ control: form.control, name: 'lines' });
  const mutation = booking
    ? { ...change, mutate: (body: BookingCreateInput, options?: Parameters<typeof change.mutate>[1]) => change.mutate({ bookingId: booking.id, version: booking.version, items: body.items }, options) }
    : book;
  const { submit, failure } = useServerSubmit(form, mutation, { fields: () => null, onSuccess: () => onDone?.() });
  const values = form.watch();
  const total = itemsOf(candidates, values).reduce((s, i) => s + ('head' in i ? i.head : 1), 0);
  const extra = total - (booking?.status === 'booked' ? booking.head : 0);
  const waits = !booking && total > freeHead;
  const set = (i: number, head: number) => form.setValue(`lines.${i}.head`, String(head), { shouldDirty: true });

  if (candidates.length === 0) return <p className="text-grey-700">No growing groups or culls to bring. Form a grow-out group or mark culls first.</p>;
  return (
    <form onSubmit={submit} noValidate aria-label={booking ? 'Change the booking' : 'Book head for the day'} className="space-y-3">
      <ul className="space-y-2">
        {lines.fields.map((field, i) => {
          const c = candidates[i]!;
          const head = Number.parseInt(values.lines[i]?.head ?? '0', 10) || 0;
          const chosen = head > 0;
          return (
            <li key={field.id} className={`rounded-xl border-2 p-3 ${chosen ? 'border-moss bg-moss-wash' : 'border-grey-200 bg-white'} ${c.eligible ? '' : 'opacity-90'}`} data-testid={`candidate-${keyOf(c)}`}>
              <div className="flex flex-wrap items-center justify-between gap-3">
                <div className="min-w-0">
                  <p className="font-semibold break-words">{c.label}</p>
                  <p className="flex flex-wrap items-center gap-2 text-sm text-grey-700">
                    {c.groupId && <span>{c.headAvailable} in the group</span>}
                    {c.readyByDay ? <Badge tone="moss">Ready by the day</Badge> : c.projectedReadyOn && <span><Timer className="inline size-4 align-[-3px]" aria-hidden="true" /> Target {formatDate(c.projectedReadyOn)}</span>}
                  </p>
                </div>
                {c.eligible && c.groupId && (
                  <div className="flex items-center gap-1" role="group" aria-label={`Head from ${c.label}`}>
                    <Button variant="secondary" className="size-12 px-0" aria-label={`One fewer from ${c.label}`} disabled={head <= 0} onClick={() => set(i, head - 1)}>
                      <Minus className="size-5" aria-hidden="true" />
                    </Button>
                    <input
                      type="number"
                      inputMode="numeric"
                      min={0}
                      max={c.headAvailable}
                      aria-label={`Head from ${c.label}`}
                      className="h-12 w-16 rounded-lg border-2 border-grey-500 text-center text-xl font-bold tabular-nums"
                      {...form.register(`lines.${i}.head`)}
                    />
                    <Button variant="secondary" className="size-12 px-0" aria-label={`One more from ${c.label}`} disabled={head >= c.headAvailable} onClick={() => set(i, head + 1)}>
                      <Plus className="size-5" aria-hidden="true" />
                    </Button>
                  </div>
                )}
                {c.eligible && c.animalId && (
                  <Button variant={chosen ? 'primary' : 'secondary'} aria-pressed={chosen} className="min-w-24" onClick={() => set(i, chosen ? 0 : 1)}>
                    {chosen ? 'Bringing' : 'Bring'}
                  </Button>
                )}
              </div>
              {!c.eligible && (
                <p className="mt-2 flex items-start gap-2 font-medium text-clay-deep" data-testid="withdrawal-refusal">
                  <TriangleAlert className="mt-0.5 size-5 shrink-0" aria-hidden="true" />
                  <span>Medicine withdrawal on the day{c.eligibleOn ? `: may be processed from ${formatDate(c.eligibleOn)}` : ''}.</span>
                </p>
              )}
            </li>
          );
        })}
      </ul>
      {waits && <Alert tone="warning">Not enough free places: this booking joins the waiting list, in turn.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" className="min-h-14 grow text-lg sm:grow-0" isBusy={booking ? change.isPending : book.isPending} disabled={total === 0}>
          {booking ? `Save: ${total} head` : waits ? `Join the waiting list: ${total} head` : `Book ${total} head`}
        </Button>
        {onDone && <Button variant="quiet" onClick={onDone}>{booking ? 'Keep as it was' : 'Not now'}</Button>}
      </div>
      {booking?.status === 'booked' && extra > 0 && extra > freeHead && <p className="text-sm text-grey-700">More head than are free: the change may be refused.</p>}
    </form>
  );
}
