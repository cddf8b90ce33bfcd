import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState, type VisibilityState } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { formatWeight, herdColumns, type AnimalListItemDto, type HerdSortKey, type HerdView, type WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { CycleBadge } from '../../doe-board';
import { DataTable } from '../../../components/ui/data-table';
import { ageClassLabels, custodyLabels, lifecycleLabels, sexLabels } from '../herd-labels';
import { breedMakeupText, PurityBadge } from './breed-makeup';
import { CoiValue } from './coi-badge';
import { columnLabels } from './herd-filters';

const column = createColumnHelper<AnimalListItemDto>();
const sortable = new Set<string>(['tattoo', 'name', 'sex', 'breed', 'birthDate', 'lifecycle', 'hutch', 'coi']);

function WeightCell({ animal, unit }: { animal: AnimalListItemDto; unit: WeightUnit }) {
  if (!animal.latestWeight) return <span className="text-grey-500">—</span>;
  return (
    <span className="whitespace-nowrap">
      {formatWeight(animal.latestWeight.grams, unit)}
      {animal.latestWeight.reviewState === 'pending' && (
        <Badge tone="straw" className="ml-2">
          Unverified
        </Badge>
      )}
    </span>
  );
}

function columnsFor(unit: WeightUnit) {
  return [
    column.accessor('tattoo', {
      id: 'tattoo',
      header: columnLabels.tattoo,
      cell: (info) => (
        <Link to={`/herd/${info.row.original.id}`} className="inline-flex min-h-11 items-center font-semibold text-moss-deep underline decoration-2 underline-offset-4">
          {info.getValue()}
        </Link>
      ),
    }),
    column.accessor('name', { id: 'name', header: columnLabels.name, cell: (info) => info.getValue() || <span className="text-grey-500">—</span> }),
    column.accessor('sex', { id: 'sex', header: columnLabels.sex, cell: (info) => sexLabels[info.getValue()] }),
    column.accessor((a) => breedMakeupText(a.breedMakeup), { id: 'breed', header: columnLabels.breed }),
    column.display({ id: 'purity', header: columnLabels.purity, cell: (info) => <PurityBadge makeup={info.row.original.breedMakeup} /> }),
    column.accessor('ageClass', { id: 'ageClass', header: columnLabels.ageClass, cell: (info) => (info.getValue() ? ageClassLabels[info.getValue()!] : '—') }),
    column.accessor('birthDate', { id: 'birthDate', header: columnLabels.birthDate, cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span> }),
    column.accessor('lifecycle', { id: 'lifecycle', header: columnLabels.lifecycle, cell: (info) => lifecycleLabels[info.getValue()] }),
    column.display({ id: 'cycle', header: columnLabels.cycle, cell: (info) => (info.row.original.cycle ? <CycleBadge cycle={info.row.original.cycle} className="min-w-36 max-w-48" wrap /> : <span className="text-grey-500">—</span>) }),
    column.accessor('hutch', { id: 'hutch', header: columnLabels.hutch }),
    column.accessor('coi', { id: 'coi', header: columnLabels.coi, cell: (info) => <CoiValue coi={info.getValue()} /> }),
    column.display({ id: 'weight', header: columnLabels.weight, cell: (info) => <WeightCell animal={info.row.original} unit={unit} /> }),
    column.accessor('custody', { id: 'custody', header: columnLabels.custody, cell: (info) => custodyLabels[info.getValue()] }),
  ].map((def) => ({ ...def, enableSorting: sortable.has(def.id!) }));
}

interface HerdTableProps {
  animals: AnimalListItemDto[];
  view: HerdView;
  unit: WeightUnit;
  isRefreshing: boolean;
  onSort: (sort: HerdSortKey, dir: 'asc' | 'desc') => void;
}

/** The herd as a table on wide screens and cards on phones; sorting happens on the server, kept in the address. */
export function HerdTable({ animals, view, unit, isRefreshing, onSort }: HerdTableProps) {
  const visible = new Set(view.cols.split(','));
  const columnVisibility: VisibilityState = Object.fromEntries(herdColumns.map((c) => [c, c === 'tattoo' || visible.has(c)]));
  const sorting: SortingState = [{ id: view.sort, desc: view.dir === 'desc' }];
  const table = useReactTable({
    data: animals,
    columns: columnsFor(unit),
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => row.id,
    manualSorting: true,
    enableSortingRemoval: false,
    state: { sorting, columnVisibility },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const first = next[0];
      if (first) onSort(first.id as HerdSortKey, first.desc ? 'desc' : 'asc');
    },
  });
  return (
    <DataTable
      table={table}
      caption="Animals of the herd"
      isRefreshing={isRefreshing}
      empty="No animals match these filters."
      renderCard={(row) => {
        const a = row.original;
        return (
          <div className="space-y-2">
            <div className="flex items-start justify-between gap-3">
              <h3 className="text-lg font-semibold">
                <Link to={`/herd/${a.id}`} className="after:absolute after:inset-0 after:rounded-2xl after:content-['']">
                  {a.name || a.tattoo}
                </Link>
              </h3>
              <CoiValue coi={a.coi} />
            </div>
            <p className="text-grey-700">
              {a.tattoo} · {sexLabels[a.sex]} · {lifecycleLabels[a.lifecycle]}
              {a.ageClass && ` · ${ageClassLabels[a.ageClass]}`}
            </p>
            <p>{breedMakeupText(a.breedMakeup)}</p>
            <div className="flex flex-wrap items-center gap-2">
              <PurityBadge makeup={a.breedMakeup} />
              {a.cycle && visible.has('cycle') && <CycleBadge cycle={a.cycle} />}
              {a.custody !== 'at_home' && <Badge tone="straw">{custodyLabels[a.custody]}</Badge>}
              <WeightCell animal={a} unit={unit} />
            </div>
          </div>
        );
      }}
    />
  );
}
