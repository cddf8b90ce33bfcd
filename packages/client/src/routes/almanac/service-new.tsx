import { ArrowLeft } from 'lucide-react';
import { useSearchParams } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { breedingStockQueryOptions } from '../../features/almanac/api/get-breeding-stock';
import { ServiceForm } from '../../features/almanac/components/service-form';
import { TreatmentsCard } from '../../features/almanac/components/treatments-card';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';

export async function loader() {
  await queryClient.ensureQueryData(breedingStockQueryOptions());
  return null;
}

export function ServiceNewPage() {
  const rights = useAlmanacRights();
  const [params] = useSearchParams();
  return (
    <div className="space-y-6">
      <PageTitle>Record a service</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader title="Record a service" lead="The Almanac plans the palpation, the nest box and the kindling from this date." />
      {rights.canPlan ? (
        <>
          <Card>
            <ServiceForm initialDoeId={params.get('doeId') ?? undefined} initialBuckId={params.get('buckId') ?? undefined} />
          </Card>
          <TreatmentsCard />
        </>
      ) : (
        <Alert tone="info">Services are recorded by the members of the farm.</Alert>
      )}
    </div>
  );
}
