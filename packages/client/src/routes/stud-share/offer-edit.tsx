import { ArrowLeft } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { buckCardQueryOptions, useBuckCard } from '../../features/stud-share/api/get-buck-cards';
import { OfferForm } from '../../features/stud-share/components/offer-form';
import { errorText } from '../../lib/form-errors';
import { idFrom, useIdParam } from './stud-share-params';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(buckCardQueryOptions(idFrom(params, 'offerId')));
  return null;
}

/** /stud-share/bucks/:offerId/edit */
export function OfferEditPage() {
  const offerId = useIdParam('offerId');
  const card = useBuckCard(offerId);
  if (!card.data) return card.isError ? <Alert tone="error">{errorText(card.error)}</Alert> : <PageSpinner />;
  const name = card.data.buck.name || card.data.buck.tattoo || 'the buck';
  return (
    <div className="space-y-6">
      <PageTitle>{`Offer of ${name}`}</PageTitle>
      <LinkButton to={`/stud-share/bucks/${offerId}`} variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to {name}
      </LinkButton>
      <PageHeader title={`Offer of ${name}`} lead="Changes show on his card at once; loans already accepted keep their terms." />
      {card.data.canEdit ? (
        <Card>
          <OfferForm key={card.data.version} card={card.data} />
        </Card>
      ) : (
        <Alert tone="info">Only the members of his farm change his offer.</Alert>
      )}
    </div>
  );
}
