import { ArrowLeft } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { litterListQuerySchema, type LitterListQuery } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { PageSpinner } from '../../components/ui/spinner';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { littersQueryOptions, useLitters } from '../../features/litters/api/get-litters';
import { LittersTable } from '../../features/litters/components/litters-table';

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(littersQueryOptions(readUrlState(litterListQuerySchema, new URL(request.url).searchParams)));
  return null;
}

const statusLabels: Record<LitterListQuery['status'], string> = { nursing: 'With the doe', weaned: 'Weaned', all: 'All' };

export function LittersPage() {
  const [query, setQuery] = useUrlState(litterListQuerySchema);
  const { data, isPlaceholderData, isError, error } = useLitters(query);
  if (isError && !data) return <Alert tone="error" title="The litters did not load">{error.message}</Alert>;
  if (!data) return <PageSpinner />;
  return (
    <div className="space-y-6">
      <PageTitle>Litters</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader title="Litters" lead="Every kindling, with the kits still on the doe. Counts follow from the dated events." />
      <SegmentedFilter
        label="Show"
        value={query.status}
        onChange={(status) => setQuery({ status, page: 1 }, { replace: true })}
        options={(['nursing', 'weaned', 'all'] as const).map((status) => ({ value: status, label: statusLabels[status], count: data.counts[status] }))}
      />
      <LittersTable items={data.items} total={data.total} query={query} isRefreshing={isPlaceholderData} onSort={(sort, dir) => setQuery({ sort, dir, page: 1 })} />
      <Pagination page={query.page} pageSize={query.pageSize} total={data.total} noun="litters" onPage={(page) => setQuery({ page })} />
    </div>
  );
}
