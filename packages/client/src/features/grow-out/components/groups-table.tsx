import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useState } from 'react';
import { countOf, type GrowOutGroupListItemDto, type ReadyByDto, type WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { DataTable, RowLink } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/days';
import { gainPerDay, weight } from '../../../lib/weights';
import { readinessTone } from '../grow-out-format';

const column = createColumnHelper<GrowOutGroupListItemDto>();

function projected(g: GrowOutGroupListItemDto): string {
  const p = g.projection;
  if (p.status === 'reached') return `At target since ${formatDate(p.projectedOn!)}`;
  if (p.status !== 'projected' || !p.projectedOn) return p.status === 'too_few_weigh_ins' ? 'Weigh twice to project' : 'No projection';
  return formatDate(p.projectedOn);
}

function intervalText(g: GrowOutGroupListItemDto): string | null {
  const i = g.projection.interval;
  return i ? `${Math.round(i.level * 100)} %: ${formatDate(i.from)} – ${formatDate(i.to)}` : null;
}

/** Growing (or closed) groups: a sortable table on wide screens, cards on phones. */
export function GroupsTable({ groups, unit, readyBy }: { groups: GrowOutGroupListItemDto[]; unit: WeightUnit; readyBy: ReadyByDto | null }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const readiness = new Map(readyBy?.entries.map((e) => [e.groupId, e]) ?? []);
  const columns = [
    column.accessor('name', { header: 'Group', cell: (c) => <RowLink to={`/grow-out/groups/${c.row.original.id}`}>{c.getValue()}</RowLink> }),
    column.accessor('currentHeads', { header: 'Heads' }),
    column.accessor('ageDays', { header: 'Age (days)' }),
    column.accessor((g) => g.latest?.gramsPerHead ?? 0, { id: 'latest', header: 'Latest mean weight', cell: (c) => (c.row.original.latest ? weight(c.row.original.latest.gramsPerHead, unit) : '—') }),
    column.accessor((g) => g.gramsPerDay ?? -1, { id: 'adg', header: 'Daily gain', cell: (c) => gainPerDay(c.row.original.gramsPerDay, unit) }),
    column.accessor((g) => g.projection.projectedOn ?? '9999', {
      id: 'projected', header: 'Projected at target',
      cell: (c) => (
        <span>
          {projected(c.row.original)}
          {intervalText(c.row.original) && <span className="block text-sm text-grey-600">{intervalText(c.row.original)}</span>}
        </span>
      ),
    }),
    ...(readyBy
      ? [column.display({
          id: 'ready', header: `By ${formatDate(readyBy.date)}`,
          cell: (c) => {
            const r = readiness.get(c.row.original.id);
            return r ? <Badge tone={readinessTone[r.readiness]}>{r.words}</Badge> : '—';
          },
        })]
      : []),
  ];
  const table = useReactTable({ data: groups, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <DataTable
      table={table}
      caption="Grow-out groups"
      empty="No groups here yet. Form one from weaned litters."
      renderCard={(row) => {
        const g = row.original;
        const r = readiness.get(g.id);
        return (
          <div className="space-y-1">
            <RowLink to={`/grow-out/groups/${g.id}`} cover>
              {g.name}
            </RowLink>
            <p className="text-sm text-grey-700">
              {countOf(g.currentHeads, 'head')} · {countOf(g.ageDays, 'day')} · {g.crossLabel}
            </p>
            <p>
              Latest {g.latest ? weight(g.latest.gramsPerHead, unit) : '—'} · gain {gainPerDay(g.gramsPerDay, unit)}
            </p>
            <p className="text-sm">
              Projected at target: <strong>{projected(g)}</strong>
              {intervalText(g) && <span className="block text-grey-600">{intervalText(g)}</span>}
            </p>
            {r && <Badge tone={readinessTone[r.readiness]}>{r.words}</Badge>}
          </div>
        );
      }}
    />
  );
}
