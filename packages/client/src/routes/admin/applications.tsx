import { Check, Copy } from 'lucide-react';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { applicationListQuerySchema, applicationStatuses, type ApplicationListQuery } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Pagination } from '../../components/ui/data-table';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SearchField } from '../../components/ui/search-field';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { PageSpinner } from '../../components/ui/spinner';
import { applicationsQueryOptions, useApplications } from '../../features/applications/api/get-applications';
import { statusLabels } from '../../features/applications/application-labels';
import { ApplicationsTable } from '../../features/applications/components/applications-table';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { useSession } from '../../lib/session';

export async function loader({ request }: LoaderFunctionArgs) {
  const query = readUrlState(applicationListQuerySchema, new URL(request.url).searchParams);
  await queryClient.ensureQueryData(applicationsQueryOptions(query));
  return null;
}

function ShareFormLink({ slug }: { slug: string }) {
  const url = `${window.location.origin}/apply/${slug}`;
  const [copied, setCopied] = useState(false);
  return (
    <div className="flex flex-wrap items-center gap-3 rounded-xl border border-grey-200 bg-white px-4 py-2">
      <span className="text-grey-600">Your application form:</span>
      <a href={url} className="font-medium break-all text-moss-deep underline underline-offset-4">
        {url}
      </a>
      <Button
        variant="quiet"
        onClick={() => {
          void navigator.clipboard?.writeText(url).then(() => setCopied(true));
        }}
      >
        {copied ? <Check className="size-4" aria-hidden="true" /> : <Copy className="size-4" aria-hidden="true" />}
        {copied ? 'Copied' : 'Copy link'}
      </Button>
    </div>
  );
}

const statusFilter: ApplicationListQuery['status'][] = ['pending', 'approved', 'rejected', 'withdrawn', 'all'];

export function ApplicationsPage() {
  const { coop } = useSession();
  const [query, setQuery] = useUrlState(applicationListQuerySchema);
  const { data, isPlaceholderData, isError, error } = useApplications(query);

  if (isError && !data) return <Alert tone="error" title="The queue did not load">{error.message}</Alert>;
  if (!data) return <PageSpinner />;

  const options = statusFilter.map((status) => ({
    value: status,
    label: status === 'all' ? 'All' : statusLabels[status],
    count: status === 'all' ? applicationStatuses.reduce((sum, s) => sum + data.counts[s], 0) : data.counts[status],
  }));
  const empty = query.q
    ? `No applications match "${query.q}".`
    : query.status === 'pending'
      ? 'No applications are waiting. New ones appear here as soon as they are sent.'
      : 'No applications here.';

  return (
    <div className="space-y-6">
      <PageTitle>Applications</PageTitle>
      <PageHeader title="Applications" lead={`People asking to join ${coop.name}. New ones appear here as they arrive.`} />
      <ShareFormLink slug={coop.slug} />
      <div className="flex flex-col gap-4 lg:flex-row lg:items-end lg:justify-between">
        <SegmentedFilter label="Show applications" options={options} value={query.status} onChange={(status) => setQuery({ status, page: 1 })} />
        <div className="lg:w-80">
          <SearchField label="Search" placeholder="Name, e-mail, farm or place" value={query.q} onSearch={(q) => setQuery({ q, page: 1 }, { replace: true })} />
        </div>
      </div>
      <ApplicationsTable
        items={data.items}
        total={data.total}
        query={query}
        isRefreshing={isPlaceholderData}
        empty={empty}
        onSort={(sort, dir) => setQuery({ sort, dir, page: 1 })}
      />
      <Pagination page={query.page} pageSize={query.pageSize} total={data.total} noun="applications" onPage={(page) => setQuery({ page })} />
    </div>
  );
}
