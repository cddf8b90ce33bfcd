import { ArrowLeft } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { breedMakeupText, formatCoi, useWeightUnit } from '../../features/herd';
import { animalViewQueryOptions, useAnimalView } from '../../features/herd/api/get-animal';
import { StudFinder } from '../../features/stud-share/components/stud-finder';
import { queryClient } from '../../app/query-client';
import { idFrom, useIdParam } from './stud-share-params';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(animalViewQueryOptions(idFrom(params, 'damId')));
  return null;
}

/** /stud-share/find/:damId — the finder from one of her does (her page and the service form link here). */
export function FinderPage() {
  const damId = useIdParam('damId');
  const unit = useWeightUnit();
  const view = useAnimalView(damId);
  if (!view.data) return view.isError ? <Alert tone="error">{view.error.message}</Alert> : <PageSpinner />;
  const dam = view.data.kind === 'record' ? view.data.animal : view.data.card;
  const name = dam.name || dam.tattoo || 'her';
  return (
    <div className="space-y-6">
      <PageTitle>{`Bucks for ${name}`}</PageTitle>
      <LinkButton to={`/herd/${dam.id}`} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to {name}
      </LinkButton>
      <PageHeader title={`Bucks for ${name}`} lead={`${dam.tattoo ?? ''} · ${breedMakeupText(dam.breedMakeup)} · her own COI ${formatCoi(dam.coi)}. Each buck offered in the co-op, with the litter he would sire with her.`} />
      {dam.sex !== 'doe' ? <Alert tone="error">The finder starts from a doe.</Alert> : <StudFinder damId={dam.id} unit={unit} />}
      <p className="text-sm text-grey-600">
        COI is computed over the whole co-op's pedigree. For scale (Falconer &amp; Mackay): first cousins give 6.25 %, half sibs 12.5 %, full sibs or parent and
        offspring 25 %.
      </p>
    </div>
  );
}
