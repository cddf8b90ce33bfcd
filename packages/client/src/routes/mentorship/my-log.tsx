import { choreLogQuerySchema } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { Spinner } from '../../components/ui/spinner';
import { logQueryOptions, useChoreLog, useMentorshipHome } from '../../features/mentorship/api/mentorship-queries';
import { ChoreCard, hoursText } from '../../features/mentorship/components/chore-card';
import { ResubmitForm } from '../../features/mentorship/components/resubmit-form';
import { useUrlState } from '../../lib/url-state';

export async function loader({ request }: { request: Request }) {
  const state = new URL(request.url).searchParams.get('state') ?? 'all';
  await queryClient.ensureQueryData(logQueryOptions(['all', 'pending', 'returned', 'accepted'].includes(state) ? state : 'all'));
  return null;
}

/** /mentorship/log: the apprentice's own entries, what waits, what came back to correct, her hours per week. */
export function MyLogPage() {
  const [view, setView] = useUrlState(choreLogQuerySchema);
  const log = useChoreLog(view.state);
  const home = useMentorshipHome();
  return (
    <div className="space-y-6">
      <PageTitle>My log</PageTitle>
      <PageHeader title="My log" lead="Returned entries carry your mentor's comment: correct them and send them again." />
      {log.data ? (
        <>
          <SegmentedFilter
            label="Show"
            value={view.state}
            onChange={(state) => setView({ state })}
            options={[
              { value: 'all', label: 'All' },
              { value: 'pending', label: 'Waiting', count: log.data.counts.pending },
              { value: 'returned', label: 'Returned', count: log.data.counts.returned },
              { value: 'accepted', label: 'Accepted', count: log.data.counts.accepted },
            ]}
          />
          {log.data.weeks.length > 0 && (
            <Card className="space-y-2">
              <h2 className="text-lg font-bold text-bark">Hours per week</h2>
              <ul className="flex flex-wrap gap-2">
                {log.data.weeks.map((w) => (
                  <li key={w.weekOf} className="rounded-lg bg-grey-50 px-3 py-2 text-sm"><span className="font-semibold">{w.weekOf}</span> · {hoursText(w.minutes)}</li>
                ))}
              </ul>
            </Card>
          )}
          {log.data.items.length === 0 ? (
            <p className="rounded-xl border border-dashed border-grey-300 p-6 text-center text-grey-600">Nothing here.</p>
          ) : (
            <ul className="grid gap-3 lg:grid-cols-2">
              {log.data.items.map((e) => (
                <li key={e.id}>
                  <ChoreCard entry={e}>{e.reviewState === 'returned' && home.data?.today && <ResubmitForm entry={e} today={home.data.today} />}</ChoreCard>
                </li>
              ))}
            </ul>
          )}
        </>
      ) : (
        <Spinner label="Loading your log" />
      )}
    </div>
  );
}
