import { Plus } from 'lucide-react';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { useListings } from '../../features/swap-board/api/get-swap-board';
import { ListingGrid } from '../../features/swap-board/components/listing-card';
import { errorText } from '../../lib/form-errors';
import { useState } from 'react';

/** /swap-board/mine — the farm's listings in every state (its apprentices see them without prices). */
export function MyListingsPage() {
  const [page, setPage] = useState(1);
  const listings = useListings({ mine: true, page, pageSize: 20 });
  return (
    <div className="space-y-6">
      <PageTitle>My listings</PageTitle>
      <PageHeader title="My listings" lead="Your farm's listings: drafts, open, under offer and closed." actions={<LinkButton to="/swap-board/new" variant="primary"><Plus className="size-5" aria-hidden="true" />List something</LinkButton>} />
      {listings.isError ? (
        <Alert tone="error">{errorText(listings.error)}</Alert>
      ) : !listings.data ? (
        <PageSpinner />
      ) : (
        <>
          <ListingGrid listings={listings.data.items} empty="Your farm has listed nothing yet." />
          <Pagination page={listings.data.page} pageSize={listings.data.pageSize} total={listings.data.total} onPage={setPage} noun="listings" />
        </>
      )}
    </div>
  );
}
