import { ArrowLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { breedingStockQueryOptions, useBreedingStock } from '../../features/almanac/api/get-breeding-stock';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';
import { HousingBoard } from '../../features/litters/components/housing-board';

export async function loader() {
  await queryClient.ensureQueryData(breedingStockQueryOptions());
  return null;
}

export function HousingPage() {
  const { data: stock } = useBreedingStock();
  const rights = useAlmanacRights();
  return (
    <div className="space-y-6">
      <PageTitle>Hutches and pens</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader title="Hutches and pens" lead="Where each animal and litter lives, from which day. The hutch on an animal’s record is the one it is in here." />
      <HousingBoard today={stock.today} canEdit={rights.canPlan} />
    </div>
  );
}
