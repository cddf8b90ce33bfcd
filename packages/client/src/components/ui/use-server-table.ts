import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type Updater } from '@tanstack/react-table';
import { useMemo } from 'react';

/** What a list endpoint pages by: the server sorts, filters and pages; the table only shows and asks. */
export interface ServerListView<S extends string> {
  sort: S;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

interface ServerTableOptions<T, S extends string> {
  rows: T[];
  columns: ColumnDef<T, never>[] | ColumnDef<T>[];
  total: number;
  view: ServerListView<S>;
  /** The sorts the endpoint offers; a click on any other column asks nothing. */
  sortKeys: readonly S[];
  onSort: (sort: S, dir: 'asc' | 'desc') => void;
  rowId: (row: T) => string;
}

/** A TanStack table over one page the server chose: sorting and paging are the server's, shown here. */
export function useServerTable<T, S extends string>({ rows, columns, total, view, sortKeys, onSort, rowId }: ServerTableOptions<T, S>) {
  const sorting = useMemo<SortingState>(() => [{ id: view.sort, desc: view.dir === 'desc' }], [view.sort, view.dir]);
  return useReactTable({
    data: rows,
    columns: columns as ColumnDef<T>[],
    getRowId: rowId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    rowCount: total,
    state: { sorting, pagination: { pageIndex: view.page - 1, pageSize: view.pageSize } },
    onSortingChange: (updater: Updater<SortingState>) => {
      const first = (typeof updater === 'function' ? updater(sorting) : updater)[0];
      if (first && (sortKeys as readonly string[]).includes(first.id)) onSort(first.id as S, first.desc ? 'desc' : 'asc');
    },
  });
}
