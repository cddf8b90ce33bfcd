import { Baby, CalendarPlus, Settings, Warehouse } from 'lucide-react';
import { useSearchParams } from 'react-router-dom';
import { addDays } from '@burrowline/shared';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { Spinner } from '../../components/ui/spinner';
import { useAgenda, type AgendaRange } from '../../features/almanac/api/get-agenda';
import { firstOfMonth, shiftMonth } from '../../lib/days';
import { AgendaView } from '../../features/almanac/components/agenda-view';
import { AttentionList } from '../../features/almanac/components/attention-list';
import { OverdueLoans } from '../../features/stud-share';
import { MonthCalendar } from '../../features/almanac/components/month-calendar';
import { OpenServices } from '../../features/almanac/components/open-services';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';
import { useMyApprentices } from '../../features/mentorship';
import { useSession } from '../../lib/session';
import { useFarmToday } from '../../features/farms/hooks/use-farm-today';

type View = 'agenda' | 'month';

/** At phone width the agenda; on wide screens the month (unless the address says otherwise). */
function defaultView(): View {
  return window.matchMedia('(min-width: 768px)').matches ? 'month' : 'agenda';
}

function rangeOf(view: View, month: string, days: number): AgendaRange {
  // The grid also shows the ends of the weeks around the month.
  if (view === 'month') return { from: addDays(month, -7), to: addDays(shiftMonth(month, 1), 13), include: 'all' };
  return { days, include: 'all' };
}

export function AlmanacPage() {
  const me = useSession();
  const rights = useAlmanacRights();
  const myApprentices = useMyApprentices();
  const [params, setParams] = useSearchParams();
  const view: View = params.get('view') === 'month' ? 'month' : params.get('view') === 'agenda' ? 'agenda' : defaultView();
  const month = params.get('month');
  const farmToday = useFarmToday();
  const shownMonth = firstOfMonth(month && /^\d{4}-\d{2}-\d{2}$/.test(month) ? month : farmToday);
  const days = Math.min(62, Math.max(14, Number(params.get('days')) || 14));
  const agenda = useAgenda(rangeOf(view, shownMonth, days));

  const update = (changes: Record<string, string>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes)) next.set(key, value);
    setParams(next, { replace: true });
  };

  if (!me.user.farmId) {
    return (
      <div className="space-y-6">
        <PageTitle>Almanac</PageTitle>
        <PageHeader title="Almanac" />
        <Alert tone="info">The Almanac belongs to a farm. Ask your co-op's coordinator to attach your account to one.</Alert>
      </div>
    );
  }

  const data = agenda.data;

  return (
    <div className="space-y-6">
      <PageTitle>Almanac</PageTitle>
      <PageHeader
        title="Almanac"
        lead={data ? `${data.farm.name}: every doe on her cycle, planned by itself.` : 'Every doe on her cycle, planned by itself.'}
        actions={
          <>
            {rights.canPlan && (
              <LinkButton to="/almanac/services/new" variant="primary">
                <CalendarPlus className="size-5" aria-hidden="true" />
                Record a service
              </LinkButton>
            )}
            <LinkButton to="/litters">
              <Baby className="size-5" aria-hidden="true" />
              Litters
            </LinkButton>
            <LinkButton to="/almanac/housing" variant="quiet">
              <Warehouse className="size-5" aria-hidden="true" />
              Hutches
            </LinkButton>
            <LinkButton to="/almanac/settings" variant="quiet">
              <Settings className="size-5" aria-hidden="true" />
              Settings
            </LinkButton>
          </>
        }
      />
      {rights.isApprentice && <Alert tone="info">You see your mentor's Almanac. Tasks you tick off wait for your mentor's review.</Alert>}
      <OverdueLoans />
      {data && <AttentionList items={data.attention} />}
      {data && data.pendingReview > 0 && rights.canReview && myApprentices.any && (
        <Alert tone="info">
          {data.pendingReview === 1 ? "One of your apprentice's ticks waits" : `${data.pendingReview} of your apprentice's ticks wait`} for your review (marked
          “waiting for review”).
        </Alert>
      )}
      <SegmentedFilter
        label="Show the Almanac as"
        options={[
          { value: 'agenda', label: 'Agenda' },
          { value: 'month', label: 'Month' },
        ]}
        value={view}
        onChange={(next) => update({ view: next })}
      />
      {agenda.isError ? (
        <Alert tone="error" title="The Almanac did not load">
          {agenda.error.message}
        </Alert>
      ) : !data ? (
        <Spinner />
      ) : view === 'month' ? (
        <MonthCalendar
          agenda={data}
          month={shownMonth}
          onMonth={(first) => update({ view: 'month', month: first })}
          previous={shiftMonth(shownMonth, -1)}
          next={shiftMonth(shownMonth, 1)}
        />
      ) : (
        <>
          <AgendaView agenda={data} />
          {days < 62 && (
            <Button variant="secondary" onClick={() => update({ days: String(Math.min(62, days + 14)) })}>
              Show two more weeks
            </Button>
          )}
        </>
      )}
      <OpenServices />
    </div>
  );
}
