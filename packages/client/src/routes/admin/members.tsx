import { UserPlus } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { memberListViewSchema, memberStatuses, roles, type MemberListView } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SearchField } from '../../components/ui/search-field';
import { SelectField } from '../../components/ui/select-field';
import { PageSpinner } from '../../components/ui/spinner';
import { membersQueryOptions, useMembers } from '../../features/members/api/get-members';
import { MembersTable } from '../../features/members/components/members-table';
import { memberStatusLabels } from '../../features/members/member-labels';
import { roleLabels } from '../../lib/role-labels';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { useSession } from '../../lib/session';

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(membersQueryOptions(readUrlState(memberListViewSchema, new URL(request.url).searchParams)));
  return null;
}

const roleOptions = [{ value: 'all', label: 'Every role' }, ...roles.map((role) => ({ value: role, label: roleLabels[role] }))];
const statusOptions = [{ value: 'all', label: 'Any status' }, ...memberStatuses.map((status) => ({ value: status, label: memberStatusLabels[status] }))];

export function MembersPage() {
  const { coop } = useSession();
  const [view, setView] = useUrlState(memberListViewSchema);
  const { data, isPlaceholderData, isError, error } = useMembers(view);
  if (isError && !data) return <Alert tone="error" title="The roster did not load">{error.message}</Alert>;
  if (!data) return <PageSpinner />;

  return (
    <div className="space-y-6">
      <PageTitle>Members</PageTitle>
      <PageHeader
        title="Members"
        lead={`Everyone in ${coop.name}: roles, accounts and invitations.`}
        actions={
          <LinkButton to="/admin/members/invite" variant="primary">
            <UserPlus className="size-4" aria-hidden="true" />
            Invite someone
          </LinkButton>
        }
      />
      <div className="grid gap-4 md:grid-cols-3">
        <SearchField label="Search" placeholder="Name, e-mail or farm" value={view.q} onSearch={(q) => setView({ q, page: 1 }, { replace: true })} />
        <SelectField
          label="Role"
          options={roleOptions}
          value={view.role}
          onChange={(event) => setView({ role: event.target.value as MemberListView['role'], page: 1 })}
        />
        <SelectField
          label="Status"
          options={statusOptions}
          value={view.status}
          onChange={(event) => setView({ status: event.target.value as MemberListView['status'], page: 1 })}
        />
      </div>
      <MembersTable members={data.items} total={data.total} view={view} onView={setView} isRefreshing={isPlaceholderData} />
    </div>
  );
}
