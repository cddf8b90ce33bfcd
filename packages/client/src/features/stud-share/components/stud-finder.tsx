import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { studFinderSorts, type StudFinderRowDto, type StudFinderSort, type StudKind, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { DataTable, Pagination, RowLink } from '../../../components/ui/data-table';
import { SelectField } from '../../../components/ui/select-field';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextField } from '../../../components/ui/text-field';
import { errorText } from '../../../lib/form-errors';
import { useMoney } from '../../../lib/money';
import { gainPerDay } from '../../../lib/weights';
import { breedMakeupText, breedsQueryOptions, coiLevel, CoiValue, formatCoi } from '../../herd';
import { centsFromText } from '../../ledger';
import { useStudFinder, type FinderQuery } from '../api/find-studs';
import { distanceText, kindLabels } from '../stud-share-labels';

const PAGE_SIZE = 25;
const KM_PER_MILE = 1.609344;

const sortLabels: Record<StudFinderSort, string> = {
  rank: 'Best match (COI, make-up, growth)', coi: "Lowest litter's COI", fee: 'Lowest fee', distance: 'Nearest', growth: "Best get's growth",
};
const makeupLabels = { purebred: 'Purebred litter', known_cross: 'Known cross', partly_unknown: 'Partly unknown' } as const;
const makeupTones = { purebred: 'moss', known_cross: 'straw', partly_unknown: 'clay' } as const;

/** The finder's filters live in the address, so a reload or a shared link shows the same list. */
function useFinderQuery(damId: string, imperial: boolean) {
  const [params, setParams] = useSearchParams();
  const text = (key: string) => params.get(key) ?? '';
  const kind = text('kind') === 'loan' || text('kind') === 'service' ? (text('kind') as StudKind) : undefined;
  const sort = (studFinderSorts as readonly string[]).includes(text('sort')) ? (text('sort') as StudFinderSort) : 'rank';
  const fee = text('maxFee') ? centsFromText(text('maxFee')) : undefined;
  const distance = text('maxDistance') ? Number(text('maxDistance')) : undefined;
  const page = Math.max(1, Number(text('page')) || 1);
  const query: FinderQuery = {
    damId, kind, sort, page, pageSize: PAGE_SIZE,
    breedId: text('breedId') || undefined,
    from: text('from') || undefined,
    to: text('to') || undefined,
    freeOnly: text('from') && text('to') && text('freeOnly') === 'true' ? true : undefined,
    maxFeeCents: fee !== undefined && Number.isFinite(fee) ? fee : undefined,
    maxDistanceKm: distance !== undefined && Number.isFinite(distance) ? Math.round(distance * (imperial ? KM_PER_MILE : 1)) : undefined,
  };
  const set = (key: string, value: string) =>
    setParams(
      (current) => {
        const next = new URLSearchParams(current);
        if (value) next.set(key, value);
        else next.delete(key);
        if (key !== 'page') next.delete('page');
        return next;
      },
      { replace: true, preventScrollReset: true },
    );
  return { query, text, set };
}

function Availability({ row }: { row: StudFinderRowDto }) {
  if (row.available === null) return <span className="text-sm text-grey-600">No dates given</span>;
  return row.available ? <Badge tone="moss">Free in your dates</Badge> : <Badge tone="clay">Taken in your dates</Badge>;
}

function LitterCoi({ coi }: { coi: number }) {
  return (
    <span className="inline-flex flex-col">
      <span className="text-lg font-bold">{formatCoi(coi)}</span>
      <span className="text-sm text-grey-600">{coiLevel(coi).label}</span>
    </span>
  );
}

function GetGrowth({ row, unit }: { row: StudFinderRowDto; unit: WeightUnit }) {
  const g = row.getRecord;
  if (g.littersSired === 0) return <span className="text-grey-600">No litters on record</span>;
  return (
    <span className="text-sm">
      {g.littersSired} litters · {g.meanWeaned === null ? '—' : Math.round(g.meanWeaned * 10) / 10} weaned
      <br />
      {gainPerDay(g.meanDailyGainGrams, unit)}
    </span>
  );
}

function Ancestors({ row }: { row: StudFinderRowDto }) {
  if (row.sharedAncestors.length === 0) return <span className="text-grey-600">No shared ancestors</span>;
  return <span className="text-sm break-words">Shared: {row.sharedAncestors.map((a) => a.name || a.tattoo).join(', ')}</span>;
}

const column = createColumnHelper<StudFinderRowDto>();

/** Every offered buck in the co-op for one doe, ranked, with every ranking factor shown and filters. */
export function StudFinder({ damId, unit }: { damId: string; unit: WeightUnit }) {
  const money = useMoney();
  const imperial = unit === 'lb_oz';
  const { query, text, set } = useFinderQuery(damId, imperial);
  const finder = useStudFinder(query);
  const breeds = useQuery(breedsQueryOptions());
  // Open beside the list on wide screens; on a phone the ranking comes first and the filters fold away.
  const [filtersOpen, setFiltersOpen] = useState(() => typeof window === 'undefined' || window.matchMedia('(min-width: 768px)').matches);
  const activeFilters = ['kind', 'breedId', 'from', 'maxDistance', 'maxFee', 'freeOnly'].filter((key) => text(key)).length + (query.sort === 'rank' ? 0 : 1);
  const feesVisible = finder.data?.items.some((r) => r.card.feesVisible) ?? true;
  const linkTo = (row: StudFinderRowDto) => `/stud-share/bucks/${row.card.offerId}?damId=${damId}${query.from ? `&from=${query.from}` : ''}${query.to ? `&to=${query.to}` : ''}`;
  const name = (row: StudFinderRowDto) => row.card.buck.name || row.card.buck.tattoo || 'Unnamed buck';

  const columns = useMemo(
    () => [
      column.accessor('rank', { header: '#', enableSorting: false, cell: (c) => <span className="font-bold">{c.getValue()}</span> }),
      column.display({
        id: 'buck', header: 'Buck',
        cell: (c) => (
          <div className="min-w-48 space-y-0.5">
            <RowLink to={linkTo(c.row.original)}>{name(c.row.original)}</RowLink>
            <p className="text-sm text-grey-600">{c.row.original.card.buck.tattoo} · {breedMakeupText(c.row.original.card.buck.breedMakeup)} · {c.row.original.card.owningFarm.name}</p>
            <p className="text-sm text-bark italic">{c.row.original.explanation}</p>
          </div>
        ),
      }),
      column.display({ id: 'coi', header: "Litter's COI", cell: (c) => (<div className="min-w-32 space-y-1"><LitterCoi coi={c.row.original.litterCoi} />{c.row.original.sharedAncestors.length > 0 && <Ancestors row={c.row.original} />}</div>) }),
      column.display({ id: 'makeup', header: 'Litter make-up', cell: (c) => (<div className="min-w-36 space-y-1"><Badge tone={makeupTones[c.row.original.makeupClass]}>{makeupLabels[c.row.original.makeupClass]}</Badge><p className="text-sm">{breedMakeupText(c.row.original.litterMakeup)}</p></div>) }),
      column.display({ id: 'get', header: "Get's growth", cell: (c) => <GetGrowth row={c.row.original} unit={unit} /> }),
      column.display({
        id: 'terms', header: 'Offer · your dates',
        cell: (c) => (
          <div className="min-w-28 space-y-1 text-sm">
            <p>{[c.row.original.card.loan && kindLabels.loan, c.row.original.card.service && kindLabels.service].filter(Boolean).join(' · ')}</p>
            {c.row.original.card.feesVisible && <p>{c.row.original.feeCents ? money(c.row.original.feeCents) : 'No fee'}</p>}
            <Availability row={c.row.original} />
          </div>
        ),
      }),
      column.display({ id: 'distance', header: 'Distance', cell: (c) => <span className="text-sm">{distanceText(c.row.original.distanceKm, imperial)}</span> }),
    ],
    [money, unit, imperial, damId, query.from, query.to],
  );
  const table = useReactTable({ data: finder.data?.items ?? [], columns, getCoreRowModel: getCoreRowModel(), getRowId: (r) => r.card.offerId });

  return (
    <div className="space-y-4">
      <details className="rounded-2xl border border-grey-200 bg-white p-4 shadow-sm md:open:pb-5" open={filtersOpen} onToggle={(e) => setFiltersOpen(e.currentTarget.open)}>
        <summary className="min-h-11 cursor-pointer content-center text-lg font-bold">
          Filters and order{activeFilters > 0 && <span className="font-normal text-grey-600"> ({activeFilters} on)</span>}
        </summary>
        <div className="grid gap-3 pt-2 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField label="Order" value={query.sort} onChange={(e) => set('sort', e.target.value === 'rank' ? '' : e.target.value)} options={studFinderSorts.map((s) => ({ value: s, label: sortLabels[s] }))} />
          <SelectField label="Loan or service" value={query.kind ?? ''} onChange={(e) => set('kind', e.target.value)} options={[{ value: '', label: 'Either' }, { value: 'loan', label: kindLabels.loan }, { value: 'service', label: kindLabels.service }]} />
          <SelectField label="Breed" value={text('breedId')} onChange={(e) => set('breedId', e.target.value)} options={[{ value: '', label: 'Any breed' }, ...(breeds.data ?? []).map((b) => ({ value: b.id, label: b.name }))]} />
          <TextField label={`Within (${imperial ? 'miles' : 'km'})`} inputMode="numeric" defaultValue={text('maxDistance')} onBlur={(e) => set('maxDistance', e.target.value.trim())} />
          <TextField label="Your dates from" type="date" value={text('from')} onChange={(e) => set('from', e.target.value)} />
          <TextField label="Your dates to" type="date" value={text('to')} onChange={(e) => set('to', e.target.value)} />
          {feesVisible && <TextField label="Fee at most" inputMode="decimal" placeholder="Any" defaultValue={text('maxFee')} onBlur={(e) => set('maxFee', e.target.value.trim())} />}
          <div className="flex items-end">
            <CheckboxField label="Only bucks free in my dates" checked={text('freeOnly') === 'true'} disabled={!text('from') || !text('to')} onChange={(e) => set('freeOnly', e.target.checked ? 'true' : '')} />
          </div>
        </div>
      </details>
      {finder.data && (
        <p className="rounded-xl bg-moss-wash px-4 py-3 font-medium text-moss-deep" data-testid="finder-order">
          {finder.data.order}
        </p>
      )}
      {finder.isError && <Alert tone="error">{errorText(finder.error)}</Alert>}
      {finder.isPending ? (
        <PageSpinner />
      ) : (
        <DataTable
          table={table}
          caption={`Bucks for ${finder.data?.dam.name ?? 'the doe'}`}
          isRefreshing={finder.isFetching}
          empty={
            <span>
              No offered buck matches these filters. <Link to={`?`} replace className="font-semibold text-moss-deep underline">Clear the filters</Link>
            </span>
          }
          renderCard={(row) => {
            const r = row.original;
            return (
              <div className="space-y-3" data-testid="finder-card">
                <div className="flex items-start justify-between gap-3">
                  <div className="min-w-0">
                    <p className="text-sm font-semibold text-grey-600">#{r.rank}</p>
                    <RowLink to={linkTo(r)} cover>{name(r)}</RowLink>
                    <p className="text-sm text-grey-700">{r.card.buck.tattoo} · {r.card.owningFarm.name}</p>
                  </div>
                  <div className="text-right">
                    <p className="text-sm text-grey-600">Litter's COI</p>
                    <CoiValue coi={r.litterCoi} />
                  </div>
                </div>
                <p className="text-sm text-bark italic">{r.explanation}</p>
                <dl className="grid grid-cols-2 gap-x-3 gap-y-2 text-sm">
                  <div><dt className="text-grey-600">Litter make-up</dt><dd><Badge tone={makeupTones[r.makeupClass]}>{makeupLabels[r.makeupClass]}</Badge></dd></div>
                  <div><dt className="text-grey-600">Get's growth</dt><dd><GetGrowth row={r} unit={unit} /></dd></div>
                  <div><dt className="text-grey-600">Dates</dt><dd><Availability row={r} /></dd></div>
                  <div><dt className="text-grey-600">Distance</dt><dd>{distanceText(r.distanceKm, imperial)}</dd></div>
                  <div className="col-span-2"><dt className="sr-only">Shared ancestors</dt><dd><Ancestors row={r} /></dd></div>
                  <div className="col-span-2"><dt className="text-grey-600">Offered for</dt><dd>{[r.card.loan && kindLabels.loan, r.card.service && kindLabels.service].filter(Boolean).join(' · ')}{r.card.feesVisible && ` · ${r.feeCents ? money(r.feeCents) : 'no fee'}`}</dd></div>
                </dl>
              </div>
            );
          }}
        />
      )}
      {finder.data && <Pagination page={query.page ?? 1} pageSize={PAGE_SIZE} total={finder.data.total} onPage={(p) => set('page', String(p))} noun="bucks" />}
    </div>
  );
}
