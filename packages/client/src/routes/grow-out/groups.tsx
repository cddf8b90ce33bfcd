import { Plus, Scale } from 'lucide-react';
import { useSearchParams } from 'react-router-dom';
import { isIsoDate } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { Spinner } from '../../components/ui/spinner';
import { TextField } from '../../components/ui/text-field';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { groupsQueryOptions, useGroups } from '../../features/grow-out/api/get-groups';
import { GroupsTable } from '../../features/grow-out/components/groups-table';
import { formatDate } from '../../lib/days';

type Status = 'growing' | 'closed';

export async function loader() {
  await queryClient.ensureQueryData(groupsQueryOptions({ status: 'growing' }));
  return null;
}

/** /grow-out: the farm's groups with their projected ready dates, and which will be ready by a chosen date. */
export function GroupsPage() {
  const [params, setParams] = useSearchParams();
  const status: Status = params.get('status') === 'closed' ? 'closed' : 'growing';
  const readyParam = params.get('readyBy') ?? '';
  const readyBy = isIsoDate(readyParam) ? readyParam : undefined;
  const unit = useWeightUnit();
  const { data, isFetching, error } = useGroups({ status, ...(status === 'growing' && readyBy ? { readyBy } : {}) });
  const setParam = (key: string, value: string | null) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };

  return (
    <div className="space-y-6">
      <PageTitle>Grow-out groups</PageTitle>
      <PageHeader
        title="Grow-out groups"
        lead="Kits raised together after weaning toward a target live weight, with the day each group should get there."
        actions={(
          <>
            <LinkButton to="/weighing-round" variant="secondary">
              <Scale className="size-5" aria-hidden="true" />
              Weighing round
            </LinkButton>
            {data?.canEdit && (
              <LinkButton to="/grow-out/groups/new" variant="primary">
                <Plus className="size-5" aria-hidden="true" />
                Form a group
              </LinkButton>
            )}
          </>
        )}
      />
      <div className="flex flex-wrap items-end gap-4">
        <SegmentedFilter
          label="Show"
          value={status}
          onChange={(s) => setParam('status', s === 'growing' ? null : s)}
          options={[{ value: 'growing', label: 'Growing' }, { value: 'closed', label: 'Closed' }]}
        />
        {status === 'growing' && (
          <TextField
            className="w-56"
            label="Ready by"
            type="date"
            value={readyBy ?? ''}
            onChange={(e) => setParam('readyBy', e.target.value || null)}
            hint="Which groups reach their target by this day"
          />
        )}
      </div>
      {error && <Alert tone="error">{error.message}</Alert>}
      {!data ? (
        <Spinner />
      ) : (
        <>
          {data.readyBy && (
            <section aria-label={`Ready by ${formatDate(data.readyBy.date)}`} className="rounded-2xl border border-grey-200 bg-white p-4 shadow-sm">
              <h2 className="font-semibold">Ready by {formatDate(data.readyBy.date)}</h2>
              {data.readyBy.entries.length === 0 ? (
                <p className="text-grey-600">No growing groups.</p>
              ) : (
                <ul className="mt-2 space-y-1">
                  {data.readyBy.entries.map((e) => (
                    <li key={e.groupId}>
                      <strong>{e.name}</strong>: {e.words}
                      {e.projectedOn ? ` (projected ${formatDate(e.projectedOn)})` : ''}
                      {e.headCount !== null ? ` · ${e.headCount} heads` : ''}
                    </li>
                  ))}
                </ul>
              )}
              <p className="mt-2 text-sm text-grey-600">
                Ready: even the late end of the 90 % interval is by then. Likely: the projected day is. Possibly: only the early end is.
              </p>
            </section>
          )}
          <GroupsTable groups={data.groups} unit={unit} readyBy={data.readyBy} />
          {isFetching && <p className="sr-only">Updating…</p>}
        </>
      )}
    </div>
  );
}
