import type { ColumnDef } from '@tanstack/react-table';
import { countOf, litterSortKeys, type LitterListItemDto, type LitterListQuery, type LitterSortKey } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { useServerTable } from '../../../components/ui/use-server-table';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';

function StatusBadge({ litter }: { litter: LitterListItemDto }) {
  return <Badge tone={litter.status === 'nursing' ? 'straw' : 'neutral'}>{litter.status === 'nursing' ? 'With the doe' : 'Weaned'}</Badge>;
}

const right = (text: string | number) => <span className="block text-right">{text}</span>;

const columns: ColumnDef<LitterListItemDto>[] = [
  { id: 'dam', header: 'Dam', enableSorting: false, cell: ({ row }) => <RowLink to={`/litters/${row.original.id}`}>{animalName(row.original.dam)}</RowLink> },
  { id: 'sire', header: 'Sire', enableSorting: false, cell: ({ row }) => animalName(row.original.sire) },
  { id: 'kindledOn', accessorFn: (l) => l.kindledOn, header: 'Kindled', cell: ({ row }) => <span className="whitespace-nowrap">{formatDate(row.original.kindledOn)}</span> },
  { id: 'ageDays', header: 'Age (days)', enableSorting: false, cell: ({ row }) => right(row.original.ageDays) },
  { id: 'bornAlive', accessorFn: (l) => l.bornAlive, header: 'Born alive', cell: ({ row }) => right(row.original.bornAlive) },
  { id: 'onDoe', header: 'With the doe', enableSorting: false, cell: ({ row }) => <strong className="block text-right">{row.original.onDoe}</strong> },
  { id: 'weaned', header: 'Weaned', enableSorting: false, cell: ({ row }) => right(row.original.weaned) },
  { id: 'status', header: 'Status', enableSorting: false, cell: ({ row }) => <StatusBadge litter={row.original} /> },
];

interface LittersTableProps {
  items: LitterListItemDto[];
  total: number;
  query: LitterListQuery;
  onSort: (sort: LitterSortKey, dir: 'asc' | 'desc') => void;
  isRefreshing: boolean;
}

/** The farm's litters: the server sorts and pages; this table only shows and asks. */
export function LittersTable({ items, total, query, onSort, isRefreshing }: LittersTableProps) {
  const table = useServerTable({ rows: items, columns, total, view: query, sortKeys: litterSortKeys, onSort: onSort, rowId: (row) => row.id });
  return (
    <DataTable
      table={table}
      caption="Litters"
      isRefreshing={isRefreshing}
      empty="No litters here yet."
      renderCard={(row) => {
        const l = row.original;
        return (
          <>
            <RowLink to={`/litters/${l.id}`} cover>
              {animalName(l.dam)}
            </RowLink>
            <p className="text-sm text-grey-600">
              by {animalName(l.sire)} · kindled {formatDate(l.kindledOn)} · {countOf(l.ageDays, 'day')}
            </p>
            <p className="mt-1 flex flex-wrap items-center gap-2">
              <span>
                <strong>{l.onDoe}</strong> with the doe · {l.bornAlive} born alive · {l.weaned} weaned
              </span>
              <StatusBadge litter={l} />
            </p>
          </>
        );
      }}
    />
  );
}
