import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { PageSpinner } from '../../components/ui/spinner';
import { useFarmToday } from '../../features/farms';
import { useSwapOffers } from '../../features/swap-board/api/get-swap-board';
import { OfferThread } from '../../features/swap-board/components/offer-thread';
import { errorText } from '../../lib/form-errors';

/** /swap-board/offers — the offers the farm made, and those made on its listings, latest first. */
export function MyOffersPage() {
  const today = useFarmToday();
  const [side, setSide] = useState<'made' | 'received'>('received');
  const [page, setPage] = useState(1);
  const offers = useSwapOffers({ side, page, pageSize: 20 });
  return (
    <div className="space-y-6">
      <PageTitle>My offers</PageTitle>
      <PageHeader title="My offers" lead="Offers on your farm's listings, and the offers your farm made." />
      <SegmentedFilter label="Which offers" value={side} onChange={(v) => { setSide(v); setPage(1); }}
        options={[{ value: 'received', label: 'On my listings' }, { value: 'made', label: 'I made' }]} />
      {offers.isError ? (
        <Alert tone="error">{errorText(offers.error)}</Alert>
      ) : !offers.data ? (
        <PageSpinner />
      ) : offers.data.items.length === 0 ? (
        <p className="text-grey-600">No offers yet.</p>
      ) : (
        <div className="space-y-4">
          {offers.data.items.map((o) => (
            <div key={o.id} className="space-y-1">
              <Link to={`/swap-board/listings/${o.listingId}`} className="font-semibold text-moss-deep underline underline-offset-4">{o.listingTitle}</Link>
              <OfferThread offer={o} today={today} />
            </div>
          ))}
          <Pagination page={offers.data.page} pageSize={offers.data.pageSize} total={offers.data.total} onPage={setPage} noun="offers" />
        </div>
      )}
    </div>
  );
}
