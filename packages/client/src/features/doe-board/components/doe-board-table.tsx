import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import type { DoeBoardItemDto, DoeBoardQuery, DoeBoardSortKey } from '@burrowline/shared';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { animalName } from '../../../lib/names';
import { CycleBadge, NextAction } from './cycle-badge';

const column = createColumnHelper<DoeBoardItemDto>();

function columnsFor(today: string) {
  return [
    column.accessor('tattoo', {
      id: 'tattoo', header: 'Tattoo', enableSorting: true,
      cell: (info) => <RowLink to={`/herd/${info.row.original.id}`}>{info.getValue() || '—'}</RowLink>,
    }),
    column.accessor('name', { id: 'name', header: 'Name', enableSorting: true, cell: (info) => info.getValue() || <span className="text-grey-500">—</span> }),
    // Accessors (not display columns) so their headers sort; the server does the sorting.
    column.accessor((d) => d.cycle.state, { id: 'state', header: 'In her cycle', enableSorting: true, cell: (info) => <CycleBadge cycle={info.row.original.cycle} /> }),
    column.accessor((d) => d.cycle.next?.on ?? '', { id: 'due', header: 'Next, and when', enableSorting: true, cell: (info) => <NextAction next={info.row.original.cycle.next} today={today} /> }),
    column.accessor('hutch', { id: 'hutch', header: 'Hutch', enableSorting: false, cell: (info) => info.getValue() || <span className="text-grey-500">—</span> }),
  ];
}

interface DoeBoardTableProps {
  does: DoeBoardItemDto[];
  today: string;
  query: DoeBoardQuery;
  isRefreshing: boolean;
  onSort: (sort: DoeBoardSortKey, dir: 'asc' | 'desc') => void;
}

/** The board as a table at a desk and, on a phone, the morning's round: one card a doe, the next job first. */
export function DoeBoardTable({ does, today, query, isRefreshing, onSort }: DoeBoardTableProps) {
  const sorting: SortingState = [{ id: query.sort, desc: query.dir === 'desc' }];
  const table = useReactTable({
    data: does,
    columns: columnsFor(today),
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => row.id,
    manualSorting: true,
    enableSortingRemoval: false,
    state: { sorting },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      if (first) onSort(first.id as DoeBoardSortKey, first.desc ? 'desc' : 'asc');
    },
  });
  return (
    <DataTable
      table={table}
      caption="The farm's does and where each stands"
      isRefreshing={isRefreshing}
      empty="No does on the farm yet. Add your does in the Herd, and their cycles show here."
      renderCard={(row) => {
        const d = row.original;
        return (
          <div className="space-y-2">
            <div className="flex items-start justify-between gap-3">
              <RowLink to={`/herd/${d.id}`} cover>
                {animalName(d)}
              </RowLink>
              {d.hutch && <span className="shrink-0 text-sm text-grey-600">Hutch {d.hutch}</span>}
            </div>
            <CycleBadge cycle={d.cycle} />
            <p className="text-lg">
              <NextAction next={d.cycle.next} today={today} />
            </p>
          </div>
        );
      }}
    />
  );
}
