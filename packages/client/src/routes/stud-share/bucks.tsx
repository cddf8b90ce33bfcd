import { useQuery } from '@tanstack/react-query';
import { Plus, Search } from 'lucide-react';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { Pagination } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SelectField } from '../../components/ui/select-field';
import { breedingStockQueryOptions } from '../../features/almanac';
import { buckCardsQueryOptions, useBuckCards } from '../../features/stud-share/api/get-buck-cards';
import { BuckCardsList } from '../../features/stud-share/components/buck-cards-list';
import { useAbility } from '../../lib/ability';
import { errorText } from '../../lib/form-errors';
import { animalName } from '../../lib/names';
import { useSession } from '../../lib/session';

const PAGE_SIZE = 25;

export async function loader() {
  await queryClient.ensureQueryData(buckCardsQueryOptions({ scope: 'coop', page: 1, pageSize: PAGE_SIZE }));
  return null;
}

/** Picks one of the farm's does and opens the finder for her. */
function FindForDoe() {
  const navigate = useNavigate();
  const stock = useQuery(breedingStockQueryOptions());
  const [doeId, setDoeId] = useState('');
  const does = stock.data?.does ?? [];
  if (stock.isSuccess && does.length === 0) return null;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Find the right buck for a doe</h2>
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (doeId) navigate(`/stud-share/find/${doeId}`);
        }}
      >
        <SelectField
          className="min-w-0 flex-1 basis-60"
          label="Your doe"
          value={doeId}
          onChange={(e) => setDoeId(e.target.value)}
          options={[{ value: '', label: stock.isPending ? 'Reading your does…' : 'Choose a doe' }, ...does.map((d) => ({ value: d.id, label: animalName(d) }))]}
        />
        <Button type="submit" disabled={!doeId}>
          <Search className="size-5" aria-hidden="true" />
          Rank the bucks for her
        </Button>
      </form>
    </Card>
  );
}

/** /stud-share: every buck offered across the co-op. */
export function BucksPage() {
  const me = useSession();
  const ability = useAbility();
  const [page, setPage] = useState(1);
  const cards = useBuckCards({ scope: 'coop', page, pageSize: PAGE_SIZE });
  const canOffer = Boolean(me.user.farmId) && ability.can('manage', subjectOf('StudListing', { coopId: me.coop.id, farmId: me.user.farmId }));
  return (
    <div className="space-y-6">
      <PageTitle>Stud Share</PageTitle>
      <PageHeader
        title="Stud Share"
        lead="Bucks the co-op's farms offer on loan or for stud service."
        actions={canOffer ? <LinkButton to="/stud-share/offer" variant="primary"><Plus className="size-5" aria-hidden="true" />Offer a buck</LinkButton> : undefined}
      />
      {canOffer && <FindForDoe />}
      {cards.isError && <Alert tone="error">{errorText(cards.error)}</Alert>}
      <BuckCardsList cards={cards.data?.items ?? []} caption="Bucks offered" empty="No buck is offered in the co-op yet." isRefreshing={cards.isFetching} />
      {cards.data && cards.data.total > PAGE_SIZE && <Pagination page={page} pageSize={PAGE_SIZE} total={cards.data.total} onPage={setPage} noun="bucks" />}
    </div>
  );
}
