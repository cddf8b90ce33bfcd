import { useQuery } from '@tanstack/react-query';
import { Plus } from 'lucide-react';
import { subjectOf, swapListingQuerySchema, type SwapListingQuery } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SelectField } from '../../components/ui/select-field';
import { PageSpinner } from '../../components/ui/spinner';
import { breedingStockQueryOptions } from '../../features/almanac';
import { breedsQueryOptions } from '../../features/herd';
import { listingsQueryOptions, useListings } from '../../features/swap-board/api/get-swap-board';
import { ListingGrid } from '../../features/swap-board/components/listing-card';
import { useAbility } from '../../lib/ability';
import { errorText } from '../../lib/form-errors';
import { animalName } from '../../lib/names';
import { useSession } from '../../lib/session';
import { useUrlState } from '../../lib/url-state';

export async function loader() {
  await queryClient.ensureQueryData(listingsQueryOptions(swapListingQuerySchema.parse({})));
  return null;
}

const PRICE_CAPS = [2_500, 5_000, 10_000, 20_000];

/** The board's filters, kept in the address: kind, sex, breed, price, pedigree completeness, and one of my animals to compare COI with. */
function Filters({ query, setQuery, wanted }: { query: SwapListingQuery; setQuery: (patch: Partial<SwapListingQuery>) => void; wanted: boolean }) {
  const me = useSession();
  const breeds = useQuery(breedsQueryOptions());
  const stock = useQuery({ ...breedingStockQueryOptions(), enabled: Boolean(me.user.farmId) });
  const mine = [...(stock.data?.does ?? []), ...(stock.data?.bucks ?? [])];
  const set = (patch: Partial<SwapListingQuery>) => setQuery({ ...patch, page: 1 });
  const active = [query.kind, query.sex, query.breedId, query.maxPriceCents, query.minCompleteness, query.mateWith].filter((v) => v !== undefined).length;
  return (
    <details className="rounded-xl border border-grey-200 bg-white p-3" open={active > 0}>
      <summary className="min-h-11 cursor-pointer content-center font-semibold text-moss-deep">
        {active > 0 ? `Filters (${active} on)` : 'Filter the board'}
      </summary>
    <div className="grid grid-cols-1 gap-3 pt-3 sm:grid-cols-2 lg:grid-cols-3 xl:grid-cols-6 [&>*]:min-w-0">
      {!wanted && (
        <SelectField label="Kind" value={query.kind ?? ''} onChange={(e) => set({ kind: (e.target.value || undefined) as SwapListingQuery['kind'] })}
          options={[{ value: '', label: 'Stock and grow-out' }, { value: 'breeding_stock', label: 'Breeding stock' }, { value: 'grow_out', label: 'Grow-out' }]} />
      )}
      <SelectField label="Sex" value={query.sex ?? ''} onChange={(e) => set({ sex: (e.target.value || undefined) as SwapListingQuery['sex'] })}
        options={[{ value: '', label: 'Either' }, { value: 'doe', label: 'Does' }, { value: 'buck', label: 'Bucks' }]} />
      <SelectField label="Breed" value={query.breedId ?? ''} onChange={(e) => set({ breedId: e.target.value || undefined })}
        options={[{ value: '', label: 'Any breed' }, ...(breeds.data ?? []).map((b) => ({ value: b.id, label: b.name }))]} />
      {!wanted && (
        <>
          <SelectField label="Price up to" value={String(query.maxPriceCents ?? '')} onChange={(e) => set({ maxPriceCents: e.target.value ? Number(e.target.value) : undefined })}
            options={[{ value: '', label: 'Any price' }, ...PRICE_CAPS.map((c) => ({ value: String(c), label: `$${c / 100}` }))]} />
          <SelectField label="Pedigree known" value={String(query.minCompleteness ?? '')} onChange={(e) => set({ minCompleteness: e.target.value ? Number(e.target.value) : undefined })}
            options={[{ value: '', label: 'Any' }, { value: '0.5', label: 'Half or more' }, { value: '1', label: 'Three full generations' }]} />
          {me.user.farmId && (
            <SelectField label="COI of a litter with" value={query.mateWith ?? ''}
              onChange={(e) => set(e.target.value ? { mateWith: e.target.value, sort: 'coi' } : { mateWith: undefined, sort: 'newest', maxCoi: undefined })}
              options={[{ value: '', label: 'None of mine' }, ...mine.map((a) => ({ value: a.id, label: animalName(a) }))]} />
          )}
        </>
      )}
    </div>
    </details>
  );
}

/** /swap-board and /swap-board/wanted — the co-op's open listings as cards, phone first. */
export function BoardPage({ wanted = false }: { wanted?: boolean }) {
  const ability = useAbility();
  const me = useSession();
  const [query, setQuery] = useUrlState(swapListingQuerySchema);
  const asked: Partial<SwapListingQuery> = { ...query, ...(wanted ? { kind: 'wanted' as const } : {}) };
  const listings = useListings(asked);
  const mayList = Boolean(me.user.farmId) && ability.can('create', subjectOf('Trade', { coopId: me.coop.id, farmId: me.user.farmId }));
  return (
    <div className="space-y-6">
      <PageTitle>{wanted ? 'Wanted' : 'Swap Board'}</PageTitle>
      <PageHeader
        title={wanted ? 'Wanted' : 'Swap Board'}
        lead={wanted ? 'What members of the co-op are looking for.' : 'Breeding stock and grow-out offered across the co-op. Every animal keeps one record for life.'}
        actions={mayList ? <LinkButton to="/swap-board/new" variant="primary"><Plus className="size-5" aria-hidden="true" />List something</LinkButton> : undefined}
      />
      <Filters query={query} setQuery={setQuery} wanted={wanted} />
      {listings.isError ? (
        <Alert tone="error">{errorText(listings.error)}</Alert>
      ) : !listings.data ? (
        <PageSpinner />
      ) : (
        <>
          <ListingGrid listings={listings.data.items} empty={wanted ? 'No wanted posts right now.' : 'Nothing listed matches. Clear a filter, or list something of your own.'} />
          <Pagination page={listings.data.page} pageSize={listings.data.pageSize} total={listings.data.total} onPage={(page) => setQuery({ page })} noun="listings" />
        </>
      )}
    </div>
  );
}

export function WantedPage() {
  return <BoardPage wanted />;
}
