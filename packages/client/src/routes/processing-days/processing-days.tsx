import { History, MapPin, Plus } from 'lucide-react';
import { Link } from 'react-router-dom';
import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { daysQueryOptions, sitesQueryOptions, useDays, useSites } from '../../features/processing-days/api/get-processing-days';
import { DayCard } from '../../features/processing-days/components/day-card';
import { useAbility } from '../../lib/ability';
import { formatDate } from '../../lib/days';
import { useSession } from '../../lib/session';

export async function loader() {
  await Promise.all([queryClient.ensureQueryData(daysQueryOptions('upcoming')), queryClient.prefetchQuery(daysQueryOptions('past')), queryClient.prefetchQuery(sitesQueryOptions())]);
  return null;
}

/** /processing-days: the co-op's shared processing days, upcoming as cards; past ones lead to their summaries. */
export function ProcessingDaysPage() {
  const me = useSession();
  const ability = useAbility();
  const isAdmin = ability.can('manage', subjectOf('ProcessingDay', { coopId: me.coop.id }));
  const { data: upcoming } = useDays('upcoming');
  const { data: past } = useDays('past');
  const { data: sites = [] } = useSites();
  const mayHost = sites.some((s) => s.hostMaySchedule && s.hostFarmId === me.user.farmId);
  return (
    <div className="space-y-6">
      <PageTitle>Processing days</PageTitle>
      <PageHeader
        title="Processing days"
        lead="Shared days at a member's site: book places for your fryers, take a station, bring the kit."
        actions={
          (isAdmin || mayHost) && (
            <>
              <LinkButton variant="primary" to="/processing-days/new"><Plus className="size-5" aria-hidden="true" />Schedule a day</LinkButton>
              {isAdmin && <LinkButton to="/processing-days/sites"><MapPin className="size-5" aria-hidden="true" />Sites</LinkButton>}
            </>
          )
        }
      />
      <section aria-labelledby="upcoming-title" className="space-y-3">
        <h2 id="upcoming-title" className="text-xl font-bold">Upcoming</h2>
        {upcoming && upcoming.items.length > 0 ? (
          <ul className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
            {upcoming.items.map((day) => <DayCard key={day.id} day={day} />)}
          </ul>
        ) : (
          <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-8 text-center text-grey-600">No processing day is scheduled yet.</p>
        )}
      </section>
      {past && past.items.length > 0 && (
        <section aria-labelledby="past-title" className="space-y-3">
          <h2 id="past-title" className="flex items-center gap-2 text-xl font-bold"><History className="size-5" aria-hidden="true" />Past days</h2>
          <ul className="divide-y divide-grey-200 rounded-2xl border border-grey-200 bg-white">
            {past.items.map((day) => (
              <li key={day.id}>
                <Link to={`/processing-days/${day.id}/summary`} className="flex min-h-14 flex-wrap items-center justify-between gap-x-4 px-4 py-2 hover:bg-oat/60">
                  <span className="font-semibold text-moss-deep">{formatDate(day.date)}</span>
                  <span className="text-grey-700">{day.siteName} · {day.capacity.bookedHead} head</span>
                </Link>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
