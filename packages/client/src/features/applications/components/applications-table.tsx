import type { ColumnDef } from '@tanstack/react-table';
import { applicationSortKeys, type ApplicationListItemDto, type ApplicationListQuery, type ApplicationSortKey } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { useServerTable } from '../../../components/ui/use-server-table';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { formatInstant } from '../../../lib/dates';
import { ApplicationStatusBadge } from './application-status-badge';

function ApplicantLink({ application, cover = false }: { application: ApplicationListItemDto; cover?: boolean }) {
  return (
    <RowLink to={`/admin/applications/${application.id}`} cover={cover}>
      {application.applicantName}
    </RowLink>
  );
}

function NewMark({ application }: { application: ApplicationListItemDto }) {
  return application.isNew ? (
    <Badge tone="clay" className="ml-2">
      New
    </Badge>
  ) : null;
}

function DiseaseAnswer({ application }: { application: ApplicationListItemDto }) {
  return application.diseaseLastYear ? <Badge tone="clay">Reported</Badge> : <span className="text-grey-600">None</span>;
}

const columns: ColumnDef<ApplicationListItemDto>[] = [
  {
    id: 'applicantName',
    accessorFn: (a) => a.applicantName,
    header: 'Applicant',
    cell: ({ row }) => (
      <div>
        <ApplicantLink application={row.original} />
        <NewMark application={row.original} />
        <div className="text-sm break-all text-grey-600">{row.original.email}</div>
      </div>
    ),
  },
  {
    id: 'farmName',
    accessorFn: (a) => a.farmName,
    header: 'Farm',
    cell: ({ row }) => (
      <div>
        <div className="font-medium">{row.original.farmName}</div>
        <div className="text-sm text-grey-600">{row.original.location}</div>
      </div>
    ),
  },
  { id: 'herdSize', accessorFn: (a) => a.herdSize, header: 'Herd', cell: ({ row }) => `${row.original.herdSize} breeding` },
  { id: 'disease', header: 'Disease, last year', enableSorting: false, cell: ({ row }) => <DiseaseAnswer application={row.original} /> },
  { id: 'createdAt', accessorFn: (a) => a.submittedAt, header: 'Sent', cell: ({ row }) => <span className="whitespace-nowrap">{formatInstant(row.original.submittedAt)}</span> },
  { id: 'status', accessorFn: (a) => a.status, header: 'Status', cell: ({ row }) => <ApplicationStatusBadge status={row.original.status} /> },
];

interface ApplicationsTableProps {
  items: ApplicationListItemDto[];
  total: number;
  query: ApplicationListQuery;
  onSort: (sort: ApplicationSortKey, dir: 'asc' | 'desc') => void;
  isRefreshing: boolean;
  empty: string;
}

/** The queue: sorting and paging happen on the server; this table only shows and asks. */
export function ApplicationsTable({ items, total, query, onSort, isRefreshing, empty }: ApplicationsTableProps) {
  const table = useServerTable({ rows: items, columns, total, view: query, sortKeys: applicationSortKeys, onSort: onSort, rowId: (row) => row.id });

  return (
    <DataTable
      table={table}
      caption="Applications"
      isRefreshing={isRefreshing}
      empty={empty}
      renderCard={(row) => {
        const a = row.original;
        return (
          <div className="space-y-2">
            <div className="flex flex-wrap items-center justify-between gap-2 pr-1">
              <h3 className="min-w-0">
                <ApplicantLink application={a} cover />
                <NewMark application={a} />
              </h3>
              <ApplicationStatusBadge status={a.status} />
            </div>
            <p>
              <span className="font-medium">{a.farmName}</span> · <span className="text-grey-600">{a.location}</span>
            </p>
            <p className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-grey-600">
              <span>{a.herdSize} breeding</span>
              <span>
                Disease last year: <DiseaseAnswer application={a} />
              </span>
              <span>Sent {formatInstant(a.submittedAt)}</span>
            </p>
          </div>
        );
      }}
    />
  );
}
