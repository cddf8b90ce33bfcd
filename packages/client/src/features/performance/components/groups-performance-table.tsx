import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useState } from 'react';
import type { GroupRow, WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/days';
import { useMoney } from '../../../lib/money';
import { dash, gainShort, ratio, weightOrDash, weightUnitShort, wholeDays } from '../performance-format';
import { Figure } from './does-table';

const column = createColumnHelper<GroupRow>();
const sortable = (x: number | null) => x ?? -1;
const dressOut = (x: number | null) => (x === null ? dash : `${x.toFixed(1)} %`);

/** Per grow-out group: gain, feed conversion, yield and (for who may see money) feed cost per weight. */
export function GroupsPerformanceTable({ groups, unit, showsMoney }: { groups: GroupRow[]; unit: WeightUnit; showsMoney: boolean }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const money = useMoney();
  const per = weightUnitShort(unit);
  const perLive = (g: GroupRow) => (unit === 'lb_oz' ? g.costPerLbLive : g.costPerKgLive);
  const perCarcass = (g: GroupRow) => (unit === 'lb_oz' ? g.costPerLbCarcass : g.costPerKgCarcass);
  const moneyText = (cents: number | null, suffix = '') => (cents === null ? dash : `${money(cents)}${suffix}`);
  const columns = [
    column.accessor('name', { header: 'Group', cell: (c) => (
      <span>
        <span className="whitespace-nowrap"><RowLink to={`/grow-out/groups/${c.row.original.id}`}>{c.getValue()}</RowLink></span>
        <span className="block text-sm whitespace-nowrap text-grey-600">{c.row.original.heads} heads · formed {formatDate(c.row.original.formedOn)}</span>
      </span>
    ) }),
    column.accessor('crossLabel', { header: 'Breed or cross' }),
    column.accessor((g) => sortable(g.adgGramsPerDay), { id: 'adg', header: 'Daily gain', cell: (c) => <span className="whitespace-nowrap">{gainShort(c.row.original.adgGramsPerDay, unit)}</span> }),
    column.accessor((g) => sortable(g.ageAtTargetDays), { id: 'age', header: 'Age at target', cell: (c) => <span className="whitespace-nowrap">{wholeDays(c.row.original.ageAtTargetDays)}</span> }),
    column.accessor((g) => sortable(g.feedConversion), { id: 'fcr', header: 'Feed conversion', cell: (c) => (
      <span className="whitespace-nowrap">
        {ratio(c.row.original.feedConversion)}
        <span className="block text-sm text-grey-600">{weightOrDash(c.row.original.feedGrams || null, unit)} fed</span>
      </span>
    ) }),
    column.accessor((g) => sortable(g.dressOutPercent), { id: 'dress', header: 'Dress-out', cell: (c) => <span className="whitespace-nowrap">{dressOut(c.row.original.dressOutPercent)}</span> }),
    ...(showsMoney
      ? [
          column.accessor((g) => sortable(perLive(g)), { id: 'cost', header: `Feed cost (per ${per})`, cell: (c) => (
            <span className="whitespace-nowrap">
              {moneyText(c.row.original.feedCostCents)}
              <span className="block text-sm text-grey-600">{moneyText(perLive(c.row.original))} per {per} live gain</span>
              <span className="block text-sm text-grey-600">{moneyText(perCarcass(c.row.original))} per {per} carcass</span>
            </span>
          ) }),
        ]
      : []),
  ];
  const table = useReactTable({ data: groups, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable
      table={table}
      caption="Grow-out groups"
      empty="No grow-out group was formed in this period."
      renderCard={(row) => {
        const g = row.original;
        return (
          <div className="space-y-2">
            <div className="flex items-start justify-between gap-2">
              <RowLink to={`/grow-out/groups/${g.id}`} cover>{g.name}</RowLink>
              <Badge tone={g.status === 'growing' ? 'moss' : 'neutral'}>{g.status === 'growing' ? 'Growing' : 'Closed'}</Badge>
            </div>
            <p className="text-sm text-grey-600">{g.crossLabel} · {g.heads} heads · formed {formatDate(g.formedOn)}</p>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
              <Figure term="Daily gain">{gainShort(g.adgGramsPerDay, unit)}</Figure>
              <Figure term="Age at target">{wholeDays(g.ageAtTargetDays)}</Figure>
              <Figure term="Feed conversion">{ratio(g.feedConversion)}</Figure>
              <Figure term="Dress-out">{dressOut(g.dressOutPercent)}</Figure>
              <Figure term="Feed given">{weightOrDash(g.feedGrams || null, unit)}</Figure>
              {showsMoney && <Figure term={`Feed cost per ${per} live gain`}>{moneyText(perLive(g))}</Figure>}
              {showsMoney && <Figure term={`Feed cost per ${per} carcass`}>{moneyText(perCarcass(g))}</Figure>}
            </dl>
          </div>
        );
      }}
    />
  );
}
