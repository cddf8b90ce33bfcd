import { ArrowLeft } from 'lucide-react';
import { useSearchParams } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { breedingStockQueryOptions } from '../../features/almanac';
import { OfferForm } from '../../features/stud-share/components/offer-form';

export async function loader() {
  await queryClient.prefetchQuery(breedingStockQueryOptions());
  return null;
}

/** /stud-share/offer — offering one of the farm's bucks to the co-op. */
export function OfferNewPage() {
  const [params] = useSearchParams();
  return (
    <div className="space-y-6">
      <PageTitle>Offer a buck</PageTitle>
      <LinkButton to="/stud-share/offers" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to my offers
      </LinkButton>
      <PageHeader title="Offer a buck" lead="His card shows the co-op his pedigree and what you choose to share here." />
      <Card>
        <OfferForm initialBuckId={params.get('buckId') ?? undefined} />
      </Card>
    </div>
  );
}
