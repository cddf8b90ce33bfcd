import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type Updater } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import type { AuditEventDto } from '@burrowline/shared';
import { DataTable } from '../../../components/ui/data-table';
import { formatInstant } from '../../../lib/dates';
import { describeAuditEvent, subjectLink } from '../audit-labels';

function What({ event }: { event: AuditEventDto }) {
  const to = subjectLink(event);
  const text = describeAuditEvent(event);
  return to ? (
    <Link to={to} className="text-moss-deep underline-offset-4 hover:underline">
      {text}
    </Link>
  ) : (
    <span>{text}</span>
  );
}

const who = (event: AuditEventDto) => event.actor?.name ?? (event.action === 'application.submitted' ? 'The applicant' : 'Nobody signed in');

const columns: ColumnDef<AuditEventDto>[] = [
  { id: 'createdAt', accessorFn: (e) => e.createdAt, header: 'When', cell: ({ row }) => <span className="whitespace-nowrap">{formatInstant(row.original.createdAt)}</span> },
  { id: 'actor', header: 'Who', enableSorting: false, cell: ({ row }) => who(row.original) },
  { id: 'what', header: 'What', enableSorting: false, cell: ({ row }) => <What event={row.original} /> },
  { id: 'ip', header: 'From address', enableSorting: false, cell: ({ row }) => <span className="text-sm text-grey-600">{row.original.ip ?? '—'}</span> },
];

interface AuditLogTableProps {
  items: AuditEventDto[];
  total: number;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
  onDir: (dir: 'asc' | 'desc') => void;
  isRefreshing: boolean;
}

/** The audit log, paged on the server; only the time column sorts (newest or oldest first). */
export function AuditLogTable({ items, total, dir, page, pageSize, onDir, isRefreshing }: AuditLogTableProps) {
  const sorting = useMemo<SortingState>(() => [{ id: 'createdAt', desc: dir === 'desc' }], [dir]);
  const table = useReactTable({
    data: items,
    columns,
    getRowId: (row) => row.id,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    rowCount: total,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize } },
    onSortingChange: (updater: Updater<SortingState>) => {
      const first = (typeof updater === 'function' ? updater(sorting) : updater)[0];
      if (first) onDir(first.desc ? 'desc' : 'asc');
    },
  });
  return (
    <DataTable
      table={table}
      caption="Audit log"
      isRefreshing={isRefreshing}
      empty="Nothing recorded with these filters."
      renderCard={(row) => (
        <div className="space-y-1">
          <p>
            <What event={row.original} />
          </p>
          <p className="text-sm text-grey-600">
            {who(row.original)} · {formatInstant(row.original.createdAt)}
          </p>
        </div>
      )}
    />
  );
}
