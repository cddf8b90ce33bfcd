import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useState } from 'react';
import type { BuckRow, WeightUnit } from '@burrowline/shared';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { decimal, gainShort, percent, sampleWords } from '../performance-format';
import { Figure } from './does-table';

const column = createColumnHelper<BuckRow>();
const nameOf = (r: BuckRow) => `${r.animal.name || 'Unnamed'}${r.animal.tattoo ? ` (${r.animal.tattoo})` : ''}`;
const sortable = (x: number | null) => x ?? -1;

/** Per buck: how his services took, and the litters he sired. */
export function BucksTable({ bucks, unit }: { bucks: BuckRow[]; unit: WeightUnit }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = [
    column.accessor((r) => nameOf(r), { id: 'buck', header: 'Buck', cell: (c) => (
      <span>
        <span className="whitespace-nowrap"><RowLink to={`/herd/${c.row.original.animal.id}`}>{c.getValue()}</RowLink></span>
        <span className="block text-sm text-grey-600">{c.row.original.animal.breedName ?? 'Breed unknown'}</span>
      </span>
    ) }),
    column.accessor('services', { header: 'Services' }),
    column.accessor((r) => sortable(r.conceptionRate), { id: 'conception', header: 'Conception rate', cell: (c) => `${percent(c.row.original.conceptionRate)} (${c.row.original.kindled} kindled, ${c.row.original.missed} missed)` }),
    column.accessor('littersSired', { header: 'Litters sired' }),
    column.accessor((r) => sortable(r.averageBornAlive), { id: 'born', header: 'Born alive', cell: (c) => <span className="whitespace-nowrap">{decimal(c.row.original.averageBornAlive)}</span> }),
    column.accessor((r) => sortable(r.averageWeaned), { id: 'weaned', header: 'Weaned', cell: (c) => <span className="whitespace-nowrap">{decimal(c.row.original.averageWeaned)}</span> }),
    column.accessor((r) => sortable(r.survivalToWeaning), { id: 'survival', header: 'Survival to weaning', cell: (c) => <span className="whitespace-nowrap">{percent(c.row.original.survivalToWeaning)}</span> }),
    column.accessor((r) => sortable(r.groupGainGramsPerDay), { id: 'gain', header: 'Daily gain of his kits', cell: (c) => (
      <span>
        {gainShort(c.row.original.groupGainGramsPerDay, unit)}
        <span className="block text-sm text-grey-600">{sampleWords(c.row.original.groups, 'group')}</span>
      </span>
    ) }),
  ];
  const table = useReactTable({ data: bucks, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable
      table={table}
      caption="Bucks"
      empty="No buck was used in this period."
      renderCard={(row) => {
        const r = row.original;
        return (
          <div className="space-y-2">
            <RowLink to={`/herd/${r.animal.id}`} cover>{nameOf(r)}</RowLink>
            <p className="text-sm text-grey-600">{r.animal.breedName ?? 'Breed unknown'}</p>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
              <Figure term="Conception rate">{percent(r.conceptionRate)} of {r.services}</Figure>
              <Figure term="Litters sired">{r.littersSired}</Figure>
              <Figure term="Born alive">{decimal(r.averageBornAlive)}</Figure>
              <Figure term="Weaned">{decimal(r.averageWeaned)}</Figure>
              <Figure term="Survival">{percent(r.survivalToWeaning)}</Figure>
              <Figure term="Kits' daily gain">{gainShort(r.groupGainGramsPerDay, unit)} ({sampleWords(r.groups, 'group')})</Figure>
            </dl>
          </div>
        );
      }}
    />
  );
}
