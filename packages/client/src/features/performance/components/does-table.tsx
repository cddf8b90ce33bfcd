import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useState } from 'react';
import { countOf, yearlyOutputOf, type DoeRow, type WeightUnit } from '@burrowline/shared';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { dash, decimal, gainShort, percent, ratio, weightOrDash, wholeDays } from '../performance-format';

const column = createColumnHelper<DoeRow>();
const nameOf = (r: DoeRow) => `${r.animal.name || 'Unnamed'}${r.animal.tattoo ? ` (${r.animal.tattoo})` : ''}`;
const sortable = (x: number | null) => x ?? -1;

/** Under the yearly figure: over how many days it is pro-rated, or that it is too early to judge. */
function outputNote(r: DoeRow): string | null {
  const output = yearlyOutputOf({ days: r.daysInService, kitsWeanedPerYear: r.kitsWeanedPerYear });
  if (!output.judged) return `Too early to judge: ${countOf(r.daysInService, 'day')} in service`;
  return r.daysInService < 365 ? `Pro-rated from ${r.daysInService} days` : null;
}

/** Per doe: her litters and what she raised, over the period. */
export function DoesTable({ does, unit }: { does: DoeRow[]; unit: WeightUnit }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = [
    column.accessor((r) => nameOf(r), { id: 'doe', header: 'Doe', cell: (c) => (
      <span>
        <span className="whitespace-nowrap"><RowLink to={`/herd/${c.row.original.animal.id}`}>{c.getValue()}</RowLink></span>
        <span className="block text-sm text-grey-600">{c.row.original.animal.breedName ?? 'Breed unknown'}{c.row.original.animal.onFarm ? '' : ' · no longer here'}</span>
      </span>
    ) }),
    column.accessor('litters', { header: 'Litters', cell: (c) => (
      <span className="whitespace-nowrap">
        {c.getValue()}
        <span className="block text-sm text-grey-600">{decimal(c.row.original.littersPerYear)} a year</span>
        {c.row.original.kindlingIntervalDays !== null && <span className="block text-sm text-grey-600">every {wholeDays(c.row.original.kindlingIntervalDays)}</span>}
      </span>
    ) }),
    column.accessor((r) => sortable(r.averageBornAlive), { id: 'born', header: 'Born alive → weaned', cell: (c) => (
      <span className="whitespace-nowrap">
        {decimal(c.row.original.averageBornAlive)} → {decimal(c.row.original.averageWeaned)}
        <span className="block text-sm text-grey-600">{percent(c.row.original.survivalToWeaning)} survival</span>
      </span>
    ) }),
    column.accessor((r) => sortable(r.averageLitterWeaningGrams), { id: 'weight', header: 'Litter at weaning', cell: (c) => <span className="whitespace-nowrap">{weightOrDash(c.row.original.averageLitterWeaningGrams, unit)}</span> }),
    column.accessor((r) => sortable(r.kitsWeanedPerYear), { id: 'kpy', header: 'Weaned a year', cell: (c) => (
      <span className="block max-w-44">
        {decimal(c.row.original.kitsWeanedPerYear)} kits
        {outputNote(c.row.original) && <span className="block text-sm text-grey-600">{outputNote(c.row.original)}</span>}
        <span className="block text-sm text-grey-600">{weightOrDash(c.row.original.carcassGramsPerYear, unit)} carcass</span>
      </span>
    ) }),
    column.accessor((r) => sortable(r.feedConversionToWeaning), { id: 'fcr', header: 'Feed conversion', cell: (c) => (
      <span className="whitespace-nowrap">
        {ratio(c.row.original.feedConversionToWeaning)} to weaning
        <span className="block text-sm text-grey-600">{ratio(c.row.original.feedConversionToMarket)} to market</span>
      </span>
    ) }),
    column.accessor((r) => sortable(r.litterGainGramsPerDay), { id: 'gain', header: 'Her kits\u2019 gain', cell: (c) => <span className="whitespace-nowrap">{gainShort(c.row.original.litterGainGramsPerDay, unit)}</span> }),
    column.accessor((r) => sortable(r.conceptionRate), { id: 'conception', header: 'Conception', cell: (c) => (
      <span className="whitespace-nowrap">
        {percent(c.row.original.conceptionRate)}
        <span className="block text-sm text-grey-600">of {countOf(c.row.original.services, 'service')}</span>
      </span>
    ) }),
  ];
  const table = useReactTable({ data: does, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable
      table={table}
      caption="Does"
      empty="No doe was serviced or kindled in this period."
      renderCard={(row) => {
        const r = row.original;
        return (
          <div className="space-y-2">
            <RowLink to={`/herd/${r.animal.id}`} cover>{nameOf(r)}</RowLink>
            <p className="text-sm text-grey-600">{r.animal.breedName ?? 'Breed unknown'}{r.animal.onFarm ? '' : ' · no longer here'}</p>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
              <Figure term="Litters">{r.litters} ({decimal(r.littersPerYear)} a year)</Figure>
              <Figure term="Kindling interval">{wholeDays(r.kindlingIntervalDays)}</Figure>
              <Figure term="Born alive">{decimal(r.averageBornAlive)}</Figure>
              <Figure term="Weaned">{decimal(r.averageWeaned)}</Figure>
              <Figure term="Survival">{percent(r.survivalToWeaning)}</Figure>
              <Figure term="Litter at weaning">{weightOrDash(r.averageLitterWeaningGrams, unit)}</Figure>
              <Figure term="Kits weaned a year">
                {decimal(r.kitsWeanedPerYear)}
                {outputNote(r) && <span className="block text-xs font-normal text-grey-600">{outputNote(r)}</span>}
              </Figure>
              <Figure term="Carcass a year">{weightOrDash(r.carcassGramsPerYear, unit)}</Figure>
              <Figure term="Feed conv. to weaning">{ratio(r.feedConversionToWeaning)}</Figure>
              <Figure term="Feed conv. to market">{ratio(r.feedConversionToMarket)}</Figure>
              <Figure term="Conception">{r.services > 0 ? `${percent(r.conceptionRate)} of ${r.services}` : dash}</Figure>
            </dl>
          </div>
        );
      }}
    />
  );
}

export function Figure({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-grey-600">{term}</dt>
      <dd className="font-medium text-bark">{children}</dd>
    </div>
  );
}
