import { FileUp, Plus } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { herdViewSchema, subjectOf, type AnimalListQuery, type HerdView } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { ExportCsvLink, HutchCardsLink } from '../../features/herd-files/components/download-links';
import { breedsQueryOptions, useBreeds } from '../../features/herd/api/get-breeds';
import { herdQueryOptions, useHerd } from '../../features/herd/api/get-herd';
import { HerdFilters } from '../../features/herd/components/herd-filters';
import { HerdTable } from '../../features/herd/components/herd-table';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
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

export function HerdPage() {
  const me = useSession();
  const ability = useAbility();
  const [view, setView] = useUrlState(herdViewSchema);
  const herd = useHerd(listQueryOf(view));
  const breeds = useBreeds();
  const unit = useWeightUnit();
  const farmId = me.user.farmId;
  const canAdd = Boolean(farmId) && ability.can('create', subjectOf('Animal', { coopId: me.coop.id, owningFarmId: farmId, keepingFarmId: farmId }));

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
          />
          <Pagination page={herd.data.page} pageSize={herd.data.pageSize} total={herd.data.total} noun="animals" onPage={(page) => setView({ page })} />
        </>
      )}
    </div>
  );
}
