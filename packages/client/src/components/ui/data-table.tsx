import { flexRender, type Header, type Row, type Table } from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown, ChevronLeft, ChevronRight } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '../../lib/cn';
import { Button } from './button';
import { useMoreToTheRight } from './use-more-to-the-right';

function SortableHeader<T>({ header }: { header: Header<T, unknown> }) {
  const label = flexRender(header.column.columnDef.header, header.getContext());
  // The same height as a sort button's, so plain and sortable labels sit on one line.
  if (!header.column.getCanSort()) return <span className="inline-flex min-h-11 items-center">{label}</span>;
  const sorted = header.column.getIsSorted();
  const Icon = sorted === 'asc' ? ArrowUp : sorted === 'desc' ? ArrowDown : ArrowUpDown;
  return (
    <button
      type="button"
      onClick={header.column.getToggleSortingHandler()}
      className="-mx-2 inline-flex min-h-11 items-center gap-1.5 rounded-lg px-2 text-left font-semibold hover:bg-grey-100"
    >
      {label}
      <Icon className={cn('size-4 shrink-0', sorted ? 'text-moss-deep' : 'text-grey-400')} aria-hidden="true" />
    </button>
  );
}

/** The link that names a row: plain in the table; on a phone's card it covers the whole card for a gloved tap. */
export function RowLink({ to, cover = false, children }: { to: string; cover?: boolean; children: ReactNode }) {
  return (
    <Link
      to={to}
      className={
        cover
          ? "rounded text-lg font-semibold text-moss-deep after:absolute after:inset-0 after:rounded-2xl after:content-['']"
          : 'inline-flex min-h-11 items-center rounded font-semibold text-moss-deep underline-offset-4 hover:underline'
      }
    >
      {children}
    </Link>
  );
}

interface DataTableProps<T> {
  table: Table<T>;
  /** Names the table (and the card list on a phone) for assistive tech. */
  caption: string;
  /** How one row reads as a card on a narrow screen. */
  renderCard: (row: Row<T>) => ReactNode;
  /** Extra classes of a row's card (a chosen one stands out). */
  cardClassName?: (row: Row<T>) => string;
  empty: ReactNode;
  /** Rows being refetched (filters changed): dim them rather than flash a spinner. */
  isRefreshing?: boolean;
}

/** A dense table on wide screens and a list of cards on phones, from one TanStack table. */
export function DataTable<T>({ table, caption, renderCard, cardClassName, empty, isRefreshing = false }: DataTableProps<T>) {
  const rows = table.getRowModel().rows;
  const scroller = useMoreToTheRight();
  if (rows.length === 0) return <div className="rounded-2xl border border-dashed border-grey-300 bg-white p-8 text-center text-grey-600">{empty}</div>;
  return (
    <div className={cn('transition-opacity', isRefreshing && 'opacity-60')} aria-busy={isRefreshing || undefined}>
      {scroller.more && (
        <p className="mb-1 hidden text-right text-sm font-medium text-grey-600 md:block" aria-hidden="true">
          More columns to the right <ChevronRight className="inline size-4" />
        </p>
      )}
      <div
        ref={scroller.ref}
        className={cn(
          'hidden overflow-x-auto rounded-2xl border border-grey-200 bg-white shadow-sm md:block',
          scroller.more && '[mask-image:linear-gradient(to_right,black_calc(100%-3rem),transparent)]',
        )}
      >
        <table className="w-full text-left">
          <caption className="sr-only">{caption}</caption>
          <thead className="border-b border-grey-200 bg-grey-50 text-sm text-grey-700">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className="px-3 py-1 align-bottom font-semibold"
                      aria-sort={header.column.getCanSort() ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                    >
                      {header.isPlaceholder ? null : <SortableHeader header={header} />}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-grey-200">
            {rows.map((row) => (
              <tr key={row.id} className="align-top hover:bg-oat/60">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-3">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul aria-label={caption} className="space-y-3 md:hidden">
        {rows.map((row) => (
          <li key={row.id} className={cn('relative rounded-2xl border border-grey-200 bg-white p-4 shadow-sm', cardClassName?.(row))}>
            {renderCard(row)}
          </li>
        ))}
      </ul>
    </div>
  );
}

interface PaginationProps {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
  /** "applications", "members"… */
  noun: string;
}

export function Pagination({ page, pageSize, total, onPage, noun }: PaginationProps) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label={`Pages of ${noun}`} className="flex flex-wrap items-center justify-between gap-3">
      <p className="text-grey-600" aria-live="polite">
        {total === 0 ? `No ${noun}` : `${first}–${last} of ${total} ${noun}`}
        {pages > 1 && ` · page ${page} of ${pages}`}
      </p>
      {pages > 1 && (
        <div className="flex gap-2">
          <Button variant="secondary" onClick={() => onPage(page - 1)} disabled={page <= 1}>
            <ChevronLeft className="size-4" aria-hidden="true" />
            Previous
          </Button>
          <Button variant="secondary" onClick={() => onPage(page + 1)} disabled={page >= pages}>
            Next
            <ChevronRight className="size-4" aria-hidden="true" />
          </Button>
        </div>
      )}
    </nav>
  );
}
