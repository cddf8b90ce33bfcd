import { ArrowLeft } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { trialMatingViewSchema, type PedigreeCardDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { animalViewQueryOptions, useAnimalView } from '../../features/herd/api/get-animal';
import { breedMakeupText } from '../../features/herd/components/breed-makeup';
import { BuckPicker, TrialResults } from '../../features/herd/components/trial-mating';
import { formatCoi } from '../../features/herd/herd-labels';
import { useSession } from '../../lib/session';
import { useUrlState } from '../../lib/url-state';
import { animalIdFrom, useAnimalIdParam } from './animal-id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(animalViewQueryOptions(animalIdFrom(params)));
  return null;
}

export function TrialMatingPage() {
  const me = useSession();
  const animalId = useAnimalIdParam();
  const view = useAnimalView(animalId);
  const [state, setState] = useUrlState(trialMatingViewSchema);
  const chosen = state.bucks.split(',').filter(Boolean);
  if (!view.data) return <PageSpinner />;
  const dam: PedigreeCardDto = view.data.kind === 'record' ? view.data.animal : view.data.card;
  const title = `Litter preview for ${dam.name || dam.tattoo}`;
  const toggle = (buckId: string) => {
    const next = chosen.includes(buckId) ? chosen.filter((id) => id !== buckId) : [...chosen, buckId];
    setState({ bucks: next.join(',') }, { replace: true });
  };

  return (
    <div className="space-y-6">
      <PageTitle>{title}</PageTitle>
      <LinkButton to={`/herd/${dam.id}`} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to {dam.name || dam.tattoo}
      </LinkButton>
      <PageHeader
        title={title}
        lead={`${dam.tattoo} · ${breedMakeupText(dam.breedMakeup)} · her own COI ${formatCoi(dam.coi)}. Pick bucks from your farm or any other; nothing is booked.`}
      />
      {dam.sex !== 'doe' ? (
        <Alert tone="error">A litter preview starts from a doe.</Alert>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[22rem_minmax(0,1fr)]">
          <section aria-labelledby="pick-bucks" className="space-y-3">
            <h2 id="pick-bucks" className="text-xl font-bold">
              Bucks to try {chosen.length > 0 && <span className="font-normal text-grey-600">({chosen.length} picked)</span>}
            </h2>
            <BuckPicker ownFarmId={me.user.farmId} chosen={chosen} onToggle={toggle} />
          </section>
          <section aria-labelledby="litters" className="space-y-3">
            <h2 id="litters" className="text-xl font-bold">
              The litters
            </h2>
            <TrialResults dam={dam} sireIds={chosen} ownFarmId={me.user.farmId} />
            <p className="text-sm text-grey-600">
              COI is computed over the whole co-op's pedigree. For scale (Falconer & Mackay): first cousins give 6.25 %, half sibs
              12.5 %, full sibs or parent and offspring 25 %.
            </p>
          </section>
        </div>
      )}
    </div>
  );
}
