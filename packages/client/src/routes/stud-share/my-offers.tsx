import { Plus } from 'lucide-react';
import { subjectOf } from '@burrowline/shared';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { useBuckCards } from '../../features/stud-share/api/get-buck-cards';
import { BuckCardsList } from '../../features/stud-share/components/buck-cards-list';
import { LoanList } from '../../features/stud-share/components/loan-list';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';

/** /stud-share/offers — the farm's offered bucks and the requests for them. */
export function MyOffersPage() {
  const me = useSession();
  const ability = useAbility();
  const cards = useBuckCards({ scope: 'mine', page: 1, pageSize: 100 });
  const canOffer = Boolean(me.user.farmId) && ability.can('manage', subjectOf('StudListing', { coopId: me.coop.id, farmId: me.user.farmId }));
  return (
    <div className="space-y-6">
      <PageTitle>My offers</PageTitle>
      <PageHeader
        title="My offers"
        lead="Your farm's bucks on offer, and what other farms ask of them."
        actions={canOffer ? <LinkButton to="/stud-share/offer" variant="primary"><Plus className="size-5" aria-hidden="true" />Offer a buck</LinkButton> : undefined}
      />
      <section aria-labelledby="asked" className="space-y-3">
        <h2 id="asked" className="text-xl font-bold">Requests for your bucks</h2>
        <LoanList side="offers" empty="Nobody has asked for your bucks yet." />
      </section>
      <section aria-labelledby="offered" className="space-y-3">
        <h2 id="offered" className="text-xl font-bold">Your bucks on offer</h2>
        <BuckCardsList cards={cards.data?.items ?? []} caption="Your bucks on offer" empty="None of your bucks is offered." isRefreshing={cards.isFetching} />
      </section>
    </div>
  );
}
