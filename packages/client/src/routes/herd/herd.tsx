import { useState } from 'react';
import { FileUp, ListChecks, Plus, Scale } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { herdViewSchema, subjectOf, type AnimalListQuery, type HerdView } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { ExportCsvLink, HutchCardsLink } from '../../features/herd-files/components/download-links';
import { breedsQueryOptions, useBreeds } from '../../features/herd/api/get-breeds';
import { herdQueryOptions, useHerd } from '../../features/herd/api/get-herd';
import { HerdFilters } from '../../features/herd/components/herd-filters';
import { HerdTable, type HerdSelection } from '../../features/herd/components/herd-table';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { weighingRoundLink } from '../../features/weighing-rounds';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { HerdTabs } from './herd-tabs';

function listQueryOf(view: HerdView): AnimalListQuery {
  const { cols: _cols, ...query } = view;
  return query;
}

export async function loader({ request }: LoaderFunctionArgs) {
  const view = readUrlState(herdViewSchema, new URL(request.url).searchParams);
  await Promise.all([queryClient.ensureQueryData(herdQueryOptions(listQueryOf(view))), queryClient.ensureQueryData(breedsQueryOptions())]);
  return null;
}

/** As many as the weighing round takes at once. */
const MAX_IN_ROUND = 200;

/** The chosen animals and "Weigh these", kept in sight at the foot of the screen (above a phone's bottom bar). */
function ChosenBar({ chosen, onClear }: { chosen: ReadonlySet<string>; onClear: () => void }) {
  const n = chosen.size;
  return (
    <div
      role="region"
      aria-label="Chosen animals"
      className="sticky bottom-[calc(57px+env(safe-area-inset-bottom)+0.75rem)] z-10 flex flex-wrap items-center justify-between gap-2 rounded-2xl border-2 border-moss bg-white p-3 shadow-lg lg:bottom-4"
    >
      <p className="font-semibold" aria-live="polite">
        {n} {n === 1 ? 'animal' : 'animals'} chosen
        {n > MAX_IN_ROUND && <span className="block text-sm font-normal text-clay-deep">A round weighs {MAX_IN_ROUND} at most: untick {n - MAX_IN_ROUND}.</span>}
      </p>
      <div className="flex flex-wrap gap-2">
        <Button variant="quiet" onClick={onClear}>
          Clear
        </Button>
        {n <= MAX_IN_ROUND && (
          <LinkButton to={weighingRoundLink({ animalIds: [...chosen] })} variant="primary">
            <Scale className="size-5" aria-hidden="true" />
            Weigh these
          </LinkButton>
        )}
      </div>
    </div>
  );
}

export function HerdPage() {
  const me = useSession();
  const ability = useAbility();
  const [view, setView] = useUrlState(herdViewSchema);
  const herd = useHerd(listQueryOf(view));
  const breeds = useBreeds();
  const unit = useWeightUnit();
  const farmId = me.user.farmId;
  const canAdd = Boolean(farmId) && ability.can('create', subjectOf('Animal', { coopId: me.coop.id, owningFarmId: farmId, keepingFarmId: farmId }));
  const canWeigh = Boolean(farmId) && ability.can('create', subjectOf('WeighIn', { coopId: me.coop.id, farmId, enteredBy: me.user.id }));
  const [chosen, setChosen] = useState<ReadonlySet<string>>(new Set());
  const [selecting, setSelecting] = useState(false);
  const selection: HerdSelection | undefined = canWeigh
    ? {
        chosen,
        selecting,
        onChange: (ids, on) =>
          setChosen((was) => {
            const next = new Set(was);
            for (const id of ids) {
              if (on) next.add(id);
              else next.delete(id);
            }
            return next;
          }),
      }
    : undefined;

  return (
    <div className="space-y-6">
      <PageTitle>Herd</PageTitle>
      <PageHeader
        title="Herd"
        lead="Your farm's animals: ancestry, breed make-up, inbreeding and weights."
        actions={
          <>
            <ExportCsvLink query={listQueryOf(view)} />
            <HutchCardsLink animalIds="breeding-does">Hutch cards</HutchCardsLink>
            {canAdd && (
              <LinkButton to="/herd/import" variant="secondary">
                <FileUp className="size-5" aria-hidden="true" />
                Import
              </LinkButton>
            )}
            {canAdd && (
              <LinkButton to="/herd/new" variant="primary">
                <Plus className="size-5" aria-hidden="true" />
                Add animal
              </LinkButton>
            )}
          </>
        }
      />
      <HerdTabs />
      {me.user.role === 'apprentice' && (
        <Alert tone="info">You are reading your mentor's herd. Weights and notes you add wait for their review.</Alert>
      )}
      <HerdFilters view={view} breeds={breeds.data ?? []} onChange={(patch) => setView(patch, { replace: 'search' in patch })} />
      {canWeigh && (
        <div className="flex flex-wrap items-center gap-3 md:hidden">
          <Button variant="secondary" aria-pressed={selecting} onClick={() => setSelecting((on) => !on)}>
            <ListChecks className="size-5" aria-hidden="true" />
            {selecting ? 'Done choosing' : 'Choose animals to weigh'}
          </Button>
          {selecting && chosen.size === 0 && <p className="text-grey-600">Tap the animals to weigh.</p>}
        </div>
      )}
      {herd.isError ? (
        <Alert tone="error" title="The herd did not load">
          {herd.error.message}
        </Alert>
      ) : !herd.data ? (
        <PageSpinner />
      ) : (
        <>
          <HerdTable
            animals={herd.data.items}
            view={view}
            unit={unit}
            isRefreshing={herd.isPlaceholderData}
            onSort={(sort, dir) => setView({ sort, dir, page: 1 })}
            selection={selection}
          />
          <Pagination page={herd.data.page} pageSize={herd.data.pageSize} total={herd.data.total} noun="animals" onPage={(page) => setView({ page })} />
          {chosen.size > 0 && <ChosenBar chosen={chosen} onClear={() => setChosen(new Set())} />}
        </>
      )}
    </div>
  );
}
