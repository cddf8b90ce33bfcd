import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { isIsoDate, type PerformanceSource } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { Spinner } from '../../components/ui/spinner';
import { TextField } from '../../components/ui/text-field';
import { formatDate } from '../../lib/days';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { performanceQueryOptions, usePerformance, type PerformanceFilters } from '../../features/performance/api/get-performance';
import { BreedsComparison } from '../../features/performance/components/breeds-comparison';
import { BucksTable } from '../../features/performance/components/bucks-table';
import { DoesTable } from '../../features/performance/components/does-table';
import { GroupsPerformanceTable } from '../../features/performance/components/groups-performance-table';
import { SuggestionsList } from '../../features/performance/components/suggestions-list';

const viewOptions = [
  { value: 'does', label: 'Does' },
  { value: 'bucks', label: 'Bucks' },
  { value: 'breeds', label: 'Breeds & crosses' },
  { value: 'groups', label: 'Groups' },
] as const;
type View = (typeof viewOptions)[number]['value'];

const periodOptions = [
  { value: 'last_12_months', label: 'Last 12 months' },
  { value: 'all', label: 'All records' },
  { value: 'custom', label: 'Choose dates' },
] as const;

const missingWords: Record<PerformanceSource, string> = {
  groups: 'grow-out groups (growth, feed conversion in grow-out, age at target)',
  doeLitterFeed: 'feed given to does and litters (feed conversion doe + litter)',
  processing: 'processing records (carcass weight, dress-out)',
};

function filtersFrom(params: URLSearchParams): PerformanceFilters {
  const period = params.get('period');
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  if (period === 'custom' && isIsoDate(from) && isIsoDate(to) && from <= to) return { period: 'custom', from, to };
  return { period: period === 'all' ? 'all' : 'last_12_months' };
}

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(performanceQueryOptions(filtersFrom(new URL(request.url).searchParams)));
  return null;
}

/**
 * /grow-out/performance: the farm's own numbers behind keep and cull and the choice of breeds — per doe,
 * per buck, per breed and cross, per grow-out group — over a chosen period, with keep and cull
 * suggestions and their reasons. Read-only: nothing here changes an animal.
 */
export function PerformancePage() {
  const [params, setParams] = useSearchParams();
  const view: View = viewOptions.some((o) => o.value === params.get('view')) ? (params.get('view') as View) : 'does';
  const periodChoice = params.get('period') === 'custom' || params.get('period') === 'all' ? params.get('period')! : 'last_12_months';
  const filters = filtersFrom(params);
  const unit = useWeightUnit();
  const { data, error, isFetching, isPlaceholderData } = usePerformance(filters);
  const set = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes)) {
      if (value) next.set(key, value);
      else next.delete(key);
    }
    setParams(next, { replace: true });
  };

  return (
    <div className="space-y-6">
      <PageTitle>Performance</PageTitle>
      <PageHeader title="Performance" lead="The farm's own numbers behind keep, cull and the choice of breeds: what each doe, buck, breed and cross gives for its feed." />
      <section aria-label="Period" className="flex flex-wrap items-end gap-4">
        <div className="space-y-1">
          <p className="text-sm font-semibold text-grey-700" aria-hidden="true">Period</p>
          <SegmentedFilter label="Period" value={periodChoice} options={periodOptions} onChange={(p) => set({ period: p === 'last_12_months' ? null : p })} />
        </div>
        {periodChoice === 'custom' && (
          <>
            <TextField className="w-48" label="From" type="date" value={params.get('from') ?? ''} onChange={(e) => set({ from: e.target.value || null })} />
            <TextField className="w-48" label="To" type="date" value={params.get('to') ?? ''} onChange={(e) => set({ to: e.target.value || null })} />
          </>
        )}
      </section>
      {data && (
        <p className="text-grey-600" aria-live="polite">
          {formatDate(data.period.from)} to {formatDate(data.period.to)}
          {periodChoice === 'custom' && filters.period !== 'custom' ? ' — choose both dates, the first before the last, to set your own period' : ''}
        </p>
      )}
      <div className="space-y-1">
        <p className="text-sm font-semibold text-grey-700" aria-hidden="true">Figures per</p>
        <SegmentedFilter label="Figures per" value={view} options={viewOptions} onChange={(v) => set({ view: v === 'does' ? null : v })} />
      </div>
      {error && <Alert tone="error">{error.message}</Alert>}
      {data && data.missing.length > 0 && (
        <Alert tone="warning" title="Some figures are left out">
          These records could not be read, so the figures from them are blank: {data.missing.map((m) => missingWords[m]).join('; ')}.
        </Alert>
      )}
      {!data ? (
        <Spinner />
      ) : (
        <div className={isFetching && isPlaceholderData ? 'opacity-60 transition-opacity' : undefined}>
          {view === 'does' && (
            <div className="space-y-6">
              <Card className="space-y-3">
                <h2 className="text-xl font-semibold text-bark">Keep and cull suggestions</h2>
                <p className="text-grey-600">
                  Suggestions with their reasons, never decisions: nothing here changes an animal. Open her page to decide.
                </p>
                <SuggestionsList suggestions={data.suggestions} />
                <p className="text-sm text-grey-600">
                  Culling a doe is your call. If she goes for meat: dispatch humanely, wear gloves when dressing (tularemia), chill the carcass to
                  40 °F / 4.4 °C or below, and check that no withdrawal period from a treatment is still running — the veterinarian sets it.
                </p>
              </Card>
              <section className="space-y-3" aria-labelledby="does-heading">
                <h2 id="does-heading" className="text-xl font-semibold text-bark">Does</h2>
                <p className="text-sm text-grey-600">
                  Rates a year count from the later of the period's start and her first service. Survival: kits weaned of those she raised
                  (born alive, fostered in, less fostered out). Feed conversion: feed per unit of live young (Kellogg 1933: 5.3 at 60 days).
                </p>
                <DoesTable does={data.does} unit={unit} />
              </section>
            </div>
          )}
          {view === 'bucks' && (
            <section className="space-y-3" aria-labelledby="bucks-heading">
              <h2 id="bucks-heading" className="text-xl font-semibold text-bark">Bucks</h2>
              <p className="text-sm text-grey-600">Conception rate: services that kindled, of those kindled or missed (open services do not count yet).</p>
              <BucksTable bucks={data.bucks} unit={unit} />
            </section>
          )}
          {view === 'breeds' && (
            <section className="space-y-3" aria-labelledby="breeds-heading">
              <h2 id="breeds-heading" className="text-xl font-semibold text-bark">Breeds and crosses</h2>
              <p className="text-sm text-grey-600">
                A cross is named sire's breed first. Each figure says how many litters, groups or processing records it rests on: under three is a
                small sample, read it as a hint. A group counts for a breed or cross only when all its kits are of it.
              </p>
              <BreedsComparison breeds={data.breeds} unit={unit} />
            </section>
          )}
          {view === 'groups' && (
            <section className="space-y-3" aria-labelledby="groups-heading">
              <h2 id="groups-heading" className="text-xl font-semibold text-bark">Grow-out groups</h2>
              <p className="text-sm text-grey-600">
                Feed conversion: feed given ÷ live-weight gain (the published grow-out figure is 3.8 on pellets). Gain: the weight at the end — at
                processing, or the last weigh-in — less the first weigh-in, plus what was taken out alive before.
                {!data.showsMoney && ' Feed costs are shown to the farm\u2019s members only.'}
              </p>
              <GroupsPerformanceTable groups={data.groups} unit={unit} showsMoney={data.showsMoney} />
            </section>
          )}
        </div>
      )}
    </div>
  );
}
