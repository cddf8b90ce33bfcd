import { useQuery } from '@tanstack/react-query';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { useFarmToday } from '../../features/farms';
import { groupsQueryOptions } from '../../features/grow-out';
import { ListingForm } from '../../features/swap-board/components/listing-form';

/** /swap-board/new — list breeding stock, grow-out or a wanted post. */
export function NewListingPage() {
  const today = useFarmToday();
  const groups = useQuery(groupsQueryOptions({ status: 'growing' }));
  return (
    <div className="space-y-6">
      <PageTitle>List on the Swap Board</PageTitle>
      <PageHeader title="List on the Swap Board" lead="Animals under a medicine withdrawal, in quarantine or on loan cannot be listed until that is over." />
      <Card>
        <ListingForm today={today} groups={(groups.data?.groups ?? []).map((g) => ({ id: g.id, name: g.name }))} />
      </Card>
    </div>
  );
}
