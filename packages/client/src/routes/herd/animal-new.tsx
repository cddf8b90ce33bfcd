import { ArrowLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { breedsQueryOptions, useBreeds } from '../../features/herd/api/get-breeds';
import { AnimalForm } from '../../features/herd/components/animal-form';

export async function loader() {
  await queryClient.ensureQueryData(breedsQueryOptions());
  return null;
}

export function AnimalNewPage() {
  const breeds = useBreeds();
  return (
    <div className="space-y-6">
      <PageTitle>Add an animal</PageTitle>
      <LinkButton to="/herd" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to Herd
      </LinkButton>
      <PageHeader title="Add an animal" lead="Born here or arrived: one record for its whole life, with its ancestry." />
      <AnimalForm animal={null} breeds={breeds.data ?? []} />
    </div>
  );
}
