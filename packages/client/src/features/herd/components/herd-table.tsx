import { createColumnHelper, getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type VisibilityState } from '@tanstack/react-table';
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

/** Animals a round may weigh: alive on the farm and not lent out (the keeper weighs those). */
export const canBeWeighed = (a: AnimalListItemDto) => a.disposition === 'on_farm' && a.custody !== 'lent_out';

const shownName = (a: AnimalListItemDto) => a.name || a.tattoo || 'Unnamed';

/** Animals ticked for a weighing round; kept by the page, so they stay chosen across pages and filters. */
export interface HerdSelection {
  chosen: ReadonlySet<string>;
  /** On a phone the cards become boxes to tick instead of links (the table always has its boxes). */
  selecting: boolean;
  onChange: (ids: string[], chosen: boolean) => void;
}

const boxClass = 'size-6 shrink-0 cursor-pointer accent-moss';

function selectColumn(selection: HerdSelection): ColumnDef<AnimalListItemDto> {
  return {
    id: 'select',
    enableSorting: false,
    header: ({ table }) => {
      const ids = table.getRowModel().rows.map((r) => r.original).filter(canBeWeighed).map((a) => a.id);
      const count = ids.filter((id) => selection.chosen.has(id)).length;
      return (
        <label className="-mx-2 inline-flex min-h-11 min-w-11 cursor-pointer items-center justify-center">
          <input
            type="checkbox"
            className={boxClass}
            aria-label="Choose every animal on this page"
            disabled={ids.length === 0}
            checked={ids.length > 0 && count === ids.length}
            ref={(el) => {
              if (el) el.indeterminate = count > 0 && count < ids.length;
            }}
            onChange={(e) => selection.onChange(ids, e.target.checked)}
          />
        </label>
      );
    },
    cell: (info) => {
      const a = info.row.original;
      if (!canBeWeighed(a)) return null;
      return (
        <label className="-mx-2 inline-flex min-h-11 min-w-11 cursor-pointer items-center justify-center">
          <input type="checkbox" className={boxClass} aria-label={`Choose ${shownName(a)}`} checked={selection.chosen.has(a.id)} onChange={(e) => selection.onChange([a.id], e.target.checked)} />
        </label>
      );
    },
  };
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
  /** Boxes to tick animals for a weighing round; left out for who may not weigh. */
  selection?: HerdSelection;
}

/** The herd as a table on wide screens and cards on phones; sorting happens on the server, kept in the address. */
export function HerdTable({ animals, view, unit, isRefreshing, onSort, selection }: HerdTableProps) {
  const visible = new Set(view.cols.split(','));
  const columnVisibility: VisibilityState = Object.fromEntries(herdColumns.map((c) => [c, c === 'tattoo' || visible.has(c)]));
  const sorting: SortingState = [{ id: view.sort, desc: view.dir === 'desc' }];
  const table = useReactTable({
    data: animals,
    columns: selection ? [selectColumn(selection), ...(columnsFor(unit) as ColumnDef<AnimalListItemDto>[])] : columnsFor(unit),
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
      cardClassName={(row) => (selection?.selecting ? (selection.chosen.has(row.id) ? 'border-moss ring-2 ring-moss' : !canBeWeighed(row.original) ? 'opacity-60' : '') : '')}
      renderCard={(row) => {
        const a = row.original;
        const ticking = selection?.selecting ?? false;
        return (
          <div className="space-y-2">
            <div className="flex items-start justify-between gap-3">
              <h3 className="text-lg font-semibold">
                {ticking && selection ? (
                  canBeWeighed(a) ? (
                    // The label covers the card: a tap anywhere on it ticks the animal.
                    <label className="flex min-h-11 cursor-pointer items-center gap-3 after:absolute after:inset-0 after:rounded-2xl after:content-['']">
                      <input type="checkbox" className={`${boxClass} relative z-[1]`} checked={selection.chosen.has(a.id)} onChange={(e) => selection.onChange([a.id], e.target.checked)} />
                      {shownName(a)}
                    </label>
                  ) : (
                    <span className="flex min-h-11 items-center">{shownName(a)}</span>
                  )
                ) : (
                  <Link to={`/herd/${a.id}`} className="after:absolute after:inset-0 after:rounded-2xl after:content-['']">
                    {a.name || a.tattoo}
                  </Link>
                )}
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
