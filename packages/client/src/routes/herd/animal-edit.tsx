import { ArrowLeft } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { animalViewQueryOptions, useAnimalView } from '../../features/herd/api/get-animal';
import { breedsQueryOptions, useBreeds } from '../../features/herd/api/get-breeds';
import { AnimalForm } from '../../features/herd/components/animal-form';
import { animalIdFrom, useAnimalIdParam } from './animal-id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  const animalId = animalIdFrom(params);
  await Promise.all([queryClient.ensureQueryData(animalViewQueryOptions(animalId)), queryClient.ensureQueryData(breedsQueryOptions())]);
  return null;
}

export function AnimalEditPage() {
  const animalId = useAnimalIdParam();
  const view = useAnimalView(animalId);
  const breeds = useBreeds();
  if (!view.data) return <PageSpinner />;
  if (view.data.kind !== 'record') return <Alert tone="error">Only the animal's own farm can edit its record.</Alert>;
  const animal = view.data.animal;
  return (
    <div className="space-y-6">
      <PageTitle>{`Edit ${animal.name || animal.tattoo}`}</PageTitle>
      <LinkButton to={`/herd/${animal.id}`} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to {animal.name || animal.tattoo}
      </LinkButton>
      <PageHeader title={`Edit ${animal.name || animal.tattoo}`} />
      {/* A fresh form per version: a save made elsewhere starts the edit again from the new record. */}
      <AnimalForm key={animal.version} animal={animal} breeds={breeds.data ?? []} />
    </div>
  );
}
