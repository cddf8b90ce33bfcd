import type { ColumnDef } from '@tanstack/react-table';
import { memberSortKeys, type MemberDto, type MemberListView } from '@burrowline/shared';
import { useServerTable } from '../../../components/ui/use-server-table';
import { DataTable, Pagination, RowLink } from '../../../components/ui/data-table';
import { formatInstantDate, formatInstant } from '../../../lib/dates';
import { roleLabels } from '../../../lib/role-labels';
import { MemberStatusBadge } from './member-status-badge';

function MemberLink({ member, cover = false }: { member: MemberDto; cover?: boolean }) {
  return (
    <RowLink to={`/admin/members/${member.id}`} cover={cover}>
      {member.name}
    </RowLink>
  );
}

const columns: ColumnDef<MemberDto>[] = [
  {
    id: 'name',
    accessorFn: (m) => m.name.toLowerCase(),
    header: 'Name',
    cell: ({ row }) => (
      <div>
        <MemberLink member={row.original} />
        <div className="text-sm break-all text-grey-600">{row.original.email}</div>
      </div>
    ),
  },
  { id: 'role', accessorFn: (m) => m.role, header: 'Role', cell: ({ row }) => roleLabels[row.original.role] },
  {
    id: 'farm',
    accessorFn: (m) => (m.farm?.name ?? m.invitation?.farmName ?? '').toLowerCase(),
    header: 'Farm',
    cell: ({ row }) => row.original.farm?.name ?? (row.original.invitation ? <span className="text-grey-600">{row.original.invitation.farmName} (on accepting)</span> : <span className="text-grey-600">None</span>),
  },
  { id: 'status', accessorFn: (m) => m.status, header: 'Status', cell: ({ row }) => <MemberStatusBadge status={row.original.status} /> },
  {
    id: 'lastSignInAt',
    accessorFn: (m) => m.lastSignInAt ?? '',
    header: 'Last sign-in',
    cell: ({ row }) => (row.original.lastSignInAt ? formatInstant(row.original.lastSignInAt) : <span className="text-grey-600">Never</span>),
  },
  { id: 'joinedAt', accessorFn: (m) => m.joinedAt, header: 'Joined', cell: ({ row }) => formatInstantDate(row.original.joinedAt) },
];

interface MembersTableProps {
  members: MemberDto[];
  total: number;
  view: MemberListView;
  onView: (patch: Partial<MemberListView>) => void;
  isRefreshing: boolean;
}

/** The roster: the server filters, sorts and pages it; this table only shows and asks, with the view kept in the address. */
export function MembersTable({ members, total, view, onView, isRefreshing }: MembersTableProps) {
  const table = useServerTable({ rows: members, columns, total, view: view, sortKeys: memberSortKeys, onSort: (sort, dir) => onView({ sort, dir, page: 1 }), rowId: (row) => row.id });
  return (
    <div className="space-y-4">
      <DataTable
        table={table}
        caption="Members"
        isRefreshing={isRefreshing}
        empty={view.q ? `Nobody matches "${view.q}".` : 'Nobody here with these filters.'}
        renderCard={(row) => {
          const m = row.original;
          return (
            <div className="space-y-1.5">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <h3>
                  <MemberLink member={m} cover />
                </h3>
                <MemberStatusBadge status={m.status} />
              </div>
              <p className="text-sm break-all text-grey-600">{m.email}</p>
              <p>
                {roleLabels[m.role]} · {m.farm?.name ?? m.invitation?.farmName ?? 'No farm'}
              </p>
              <p className="text-sm text-grey-600">Last sign-in: {m.lastSignInAt ? formatInstant(m.lastSignInAt) : 'never'}</p>
            </div>
          );
        }}
      />
      <Pagination page={view.page} pageSize={view.pageSize} total={total} noun="people" onPage={(page) => onView({ page })} />
    </div>
  );
}
