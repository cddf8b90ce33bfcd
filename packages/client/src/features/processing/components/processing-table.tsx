import { useMemo, useState } from 'react';
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { formatWeight, type ProcessingRecordDto, type WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { DataTable } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/days';
import { subjectName } from '../../../lib/names';
import { ageText, percent, usdaClassLabels, usdaClassTone } from '../processing-format';

const column = createColumnHelper<ProcessingRecordDto>();

function Flags({ record, quiet = false }: { record: ProcessingRecordDto; quiet?: boolean }) {
  const notes = [...record.flags.map((f) => f.message), ...(record.usdaClassNote ? [record.usdaClassNote] : [])];
  if (notes.length === 0) return quiet ? null : <span className="text-grey-500">—</span>;
  return (
    <ul className="space-y-1 text-sm">
      {notes.map((n) => (
        <li key={n}>
          <Badge tone="straw">Check</Badge> {n}
        </li>
      ))}
    </ul>
  );
}

/** Processing records with their yields: a wide sortable table, or cards on a phone. */
export function ProcessingTable({ records, unit }: { records: ProcessingRecordDto[]; unit: WeightUnit }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'processedOn', desc: true }]);
  const columns = useMemo(
    () => [
      column.accessor('processedOn', { header: 'Processed', cell: (c) => formatDate(c.getValue()) }),
      column.accessor((r) => subjectName(r), { id: 'subject', header: 'Animal or group', enableSorting: false }),
      column.accessor('headCount', { header: 'Heads' }),
      column.accessor('ageDays', { header: 'Age', cell: (c) => ageText(c.getValue()) }),
      column.accessor('liveGrams', { header: 'Live', cell: (c) => formatWeight(c.getValue(), unit) }),
      column.accessor('hotCarcassGrams', { header: 'Hot carcass', cell: (c) => formatWeight(c.getValue(), unit) }),
      column.accessor('chilledCarcassGrams', { header: 'Chilled', cell: (c) => (c.getValue() === null ? '—' : formatWeight(c.getValue()!, unit)) }),
      column.accessor('hotDressOutPercent', {
        header: 'Dress-out',
        cell: (c) => (
          <span className="whitespace-nowrap">
            {percent(c.getValue())}
            {c.row.original.chilledDressOutPercent !== null && <span className="text-grey-600"> · {percent(c.row.original.chilledDressOutPercent)} chilled</span>}
          </span>
        ),
      }),
      column.accessor('usdaClass', { header: 'USDA class', cell: (c) => <Badge tone={usdaClassTone[c.getValue()]}>{usdaClassLabels[c.getValue()]}</Badge> }),
      column.display({ id: 'flags', header: 'Flags', cell: (c) => <Flags record={c.row.original} /> }),
    ],
    [unit],
  );
  const table = useReactTable({ data: records, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable
      table={table}
      caption="Processing records"
      empty="No processing recorded yet."
      renderCard={(row) => {
        const r = row.original;
        const perHead = r.headCount > 1 ? ` (${formatWeight(r.liveGrams / r.headCount, unit)} a head)` : '';
        return (
          <div className="space-y-1.5">
            <p className="flex flex-wrap items-center justify-between gap-2">
              <strong>{subjectName(r)}</strong>
              <Badge tone={usdaClassTone[r.usdaClass]}>{usdaClassLabels[r.usdaClass]}</Badge>
            </p>
            <p className="text-sm text-grey-600">
              {formatDate(r.processedOn)} · {r.headCount} head{r.headCount === 1 ? '' : 's'} · {ageText(r.ageDays)}
            </p>
            <p>
              Live {formatWeight(r.liveGrams, unit)}
              {perHead} → hot {formatWeight(r.hotCarcassGrams, unit)}
              {r.chilledCarcassGrams !== null ? `, chilled ${formatWeight(r.chilledCarcassGrams, unit)}` : ''}
            </p>
            <p className="text-lg font-semibold">
              Dress-out {percent(r.hotDressOutPercent)}
              {r.chilledDressOutPercent !== null && <span className="text-base font-normal text-grey-600"> · {percent(r.chilledDressOutPercent)} chilled</span>}
            </p>
            <Flags record={r} quiet />
          </div>
        );
      }}
    />
  );
}
