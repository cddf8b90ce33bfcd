import { ArrowLeft, BarChart3, Clock, Droplets, FileText, MapPin } from 'lucide-react';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Button } from '../../components/ui/button';
import { buttonClasses } from '../../components/ui/button-styles';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { bookingsQueryOptions, dayQueryOptions, daySheetUrl, useBookings, useDay } from '../../features/processing-days/api/get-processing-days';
import { useUpdateDay } from '../../features/processing-days/api/processing-day-mutations';
import { BookingsPanel } from '../../features/processing-days/components/bookings-panel';
import { CapacityBar } from '../../features/processing-days/components/capacity-bar';
import { CloseDayForm } from '../../features/processing-days/components/close-day-form';
import { DayCautions } from '../../features/processing-days/components/day-cautions';
import { MyBooking } from '../../features/processing-days/components/my-booking';
import { Roster } from '../../features/processing-days/components/roster';
import { waterLabels } from '../../features/processing-days/processing-days-format';
import { formatDate, formatLongDay } from '../../lib/days';
import { errorText } from '../../lib/form-errors';
import { useMoney } from '../../lib/money';
import { useSession } from '../../lib/session';
import { idFrom, useIdParam } from '../almanac/id-param';
import { ChatThread } from '../../features/chat';

export async function loader({ params }: LoaderFunctionArgs) {
  const dayId = idFrom(params, 'dayId');
  await Promise.all([queryClient.ensureQueryData(dayQueryOptions(dayId)), queryClient.ensureQueryData(bookingsQueryOptions(dayId))]);
  return null;
}

/** More or fewer places: more promotes the waiting list in turn. */
function CapacityEditor({ dayId, capacity, version }: { dayId: string; capacity: number; version: number }) {
  const update = useUpdateDay(dayId);
  const [value, setValue] = useState(capacity);
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <label htmlFor="capacity-edit" className="font-medium">Places</label>
        <input id="capacity-edit" type="number" inputMode="numeric" min={1} value={value} onChange={(e) => setValue(Number.parseInt(e.target.value, 10) || 0)} className="h-12 w-20 rounded-lg border-2 border-grey-500 text-center text-lg font-bold tabular-nums" />
        <Button variant="secondary" disabled={value === capacity || value < 1} isBusy={update.isPending} onClick={() => update.mutate({ version, capacityHead: value })}>Save places</Button>
      </div>
      {update.isError && <Alert tone="error">{errorText(update.error)}</Alert>}
    </div>
  );
}

/**
 * /processing-days/:dayId — the day page, used on the site with wet gloves: the places, my booking, the
 * cautions, the stations, the farms and their check-in and yields; big targets and few words.
 */
export function ProcessingDayPage() {
  const dayId = useIdParam('dayId');
  const me = useSession();
  const money = useMoney();
  const unit = useWeightUnit();
  const { data: day } = useDay(dayId);
  const { data: bookings } = useBookings(dayId);
  if (!day) return null;
  const mine = bookings?.items.filter((b) => b.farmId === me.user.farmId && b.status !== 'cancelled') ?? [];
  return (
    <div className="space-y-6">
      <PageTitle>{`Processing day ${formatDate(day.date)}`}</PageTitle>
      <TextLink to="/processing-days"><ArrowLeft className="mr-1 size-4" aria-hidden="true" />All processing days</TextLink>
      <header className="space-y-2">
        <div className="flex flex-wrap items-center gap-2">
          <h1 className="text-3xl font-bold tracking-tight text-bark">{formatLongDay(day.date)}</h1>
          {day.status !== 'scheduled' && <Badge tone={day.status === 'closed' ? 'moss' : 'clay'}>{day.status === 'closed' ? 'Closed' : 'Cancelled'}</Badge>}
        </div>
        <p className="flex flex-wrap gap-x-4 gap-y-1 text-lg text-grey-700">
          <span className="inline-flex items-center gap-1.5"><Clock className="size-5" aria-hidden="true" />{day.startTime}</span>
          <span className="inline-flex min-w-0 items-center gap-1.5"><MapPin className="size-5 shrink-0" aria-hidden="true" />{day.site.name}, {day.hostFarmName}</span>
        </p>
        <div className="flex flex-wrap gap-3 pt-1">
          <a className={buttonClasses('secondary')} href={daySheetUrl(day.id)} download><FileText className="size-5" aria-hidden="true" />Day sheet (PDF)</a>
          <LinkButton to={`/processing-days/${day.id}/summary`}><BarChart3 className="size-5" aria-hidden="true" />Summary</LinkButton>
        </div>
      </header>

      <div className="grid gap-6 lg:grid-cols-2">
        <div className="space-y-6">
          {day.status === 'closed' && (
            <Card className="space-y-3 border-2 border-moss">
              <p className="text-lg font-semibold">The day is done: yields, fees and the shared costs are in its summary.</p>
              <LinkButton variant="primary" className="w-full sm:w-auto" to={`/processing-days/${day.id}/summary`}><BarChart3 className="size-5" aria-hidden="true" />The day's summary</LinkButton>
            </Card>
          )}
          <Card className={day.status === 'closed' ? 'hidden' : 'space-y-4'}>
            <CapacityBar capacity={day.capacity} />
            {day.canEdit && day.status === 'scheduled' && <CapacityEditor key={day.version} dayId={day.id} capacity={day.capacity.capacityHead} version={day.version} />}
          </Card>
          {day.status !== 'cancelled' && <MyBooking day={day} bookings={mine} farmId={me.user.farmId} />}
        </div>
        <div className="space-y-6">
          <DayCautions cautions={day.cautions} />
          <Card className="space-y-2" data-testid="day-details">
            <h2 className="text-xl font-bold">The day</h2>
            <p className="whitespace-pre-line">{day.site.address}</p>
            <p className="inline-flex items-center gap-1.5 text-grey-700"><Droplets className="size-5" aria-hidden="true" />{waterLabels[day.site.water]}</p>
            <p className="text-grey-700">Book, change or cancel until {formatDate(day.signUpDeadline)}.</p>
            {day.feePerHeadCents !== undefined && <p className="text-grey-700">Fee {money(day.feePerHeadCents)} a head; shared costs split by head processed.</p>}
            {day.expectedCosts && day.expectedCosts.length > 0 && (
              <p className="text-sm text-grey-700">Expected: {day.expectedCosts.map((c) => `${c.label} ${money(c.amountCents)}`).join(' · ')}</p>
            )}
            {day.notes && <p className="whitespace-pre-line">{day.notes}</p>}
            {day.site.notes && <p className="text-sm whitespace-pre-line text-grey-700">{day.site.notes}</p>}
          </Card>
        </div>
      </div>

      <Roster day={day} userId={me.user.id} farmId={me.user.farmId} />
      <BookingsPanel day={day} bookings={bookings?.items ?? []} unit={unit} />
      <section aria-labelledby="day-thread" className="space-y-3">
        <h2 id="day-thread" className="text-xl font-bold">Talk about the day</h2>
        <ChatThread subject={{ type: 'processing-day', id: day.id }} />
      </section>
      {day.canClose && (
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Close the day</h2>
          <CloseDayForm day={day} />
        </Card>
      )}
    </div>
  );
}
