import type { LoaderFunctionArgs } from 'react-router-dom';
import { auditCategories, auditEventQuerySchema } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { PageSpinner } from '../../components/ui/spinner';
import { auditEventsQueryOptions, useAuditEvents } from '../../features/members/api/get-audit-events';
import { auditCategoryLabels } from '../../features/members/audit-labels';
import { AuditLogTable } from '../../features/members/components/audit-log-table';
import { readUrlState, useUrlState } from '../../lib/url-state';

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(auditEventsQueryOptions(readUrlState(auditEventQuerySchema, new URL(request.url).searchParams)));
  return null;
}

export function AuditPage() {
  const [query, setQuery] = useUrlState(auditEventQuerySchema);
  const { data, isPlaceholderData, isError, error } = useAuditEvents(query);
  if (isError && !data) return <Alert tone="error" title="The audit log did not load">{error.message}</Alert>;
  if (!data) return <PageSpinner />;
  const narrowed = query.actorId || query.subjectId;
  return (
    <div className="space-y-6">
      <PageTitle>Audit log</PageTitle>
      <PageHeader title="Audit log" lead="Who did what in the co-op: decisions on applications, changes to members, sign-ins, rules." />
      <SegmentedFilter
        label="Show"
        options={auditCategories.map((category) => ({ value: category, label: auditCategoryLabels[category] }))}
        value={query.category}
        onChange={(category) => setQuery({ category, page: 1 })}
      />
      {narrowed && (
        <Alert
          tone="info"
          actions={
            <LinkButton to="/admin/audit" variant="secondary">
              Show everyone
            </LinkButton>
          }
        >
          Showing the events about one person only.
        </Alert>
      )}
      <AuditLogTable
        items={data.items}
        total={data.total}
        dir={query.dir}
        page={query.page}
        pageSize={query.pageSize}
        isRefreshing={isPlaceholderData}
        onDir={(dir) => setQuery({ dir, page: 1 })}
      />
      <Pagination page={query.page} pageSize={query.pageSize} total={data.total} noun="events" onPage={(page) => setQuery({ page })} />
    </div>
  );
}
