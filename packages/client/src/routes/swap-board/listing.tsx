import { useQuery } from '@tanstack/react-query';
import { ArrowLeft } from 'lucide-react';
import { useState, type ReactNode } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import type { SwapAnimalDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { PageSpinner } from '../../components/ui/spinner';
import { ChatThread } from '../../features/chat';
import { useFarmToday } from '../../features/farms';
import { pedigreeQueryOptions, PedigreeTree } from '../../features/herd';
import { PedigreePdfLink } from '../../features/herd-files/components/download-links';
import { useListingStep } from '../../features/swap-board/api/swap-actions';
import { listingPageQueryOptions, useListingPage } from '../../features/swap-board/api/get-swap-board';
import { AnimalFigures, priceText } from '../../features/swap-board/components/listing-card';
import { EditListingForm } from '../../features/swap-board/components/edit-listing-form';
import { MeatCaution } from '../../features/swap-board/components/meat-caution';
import { OfferForm } from '../../features/swap-board/components/offer-form';
import { OfferThread } from '../../features/swap-board/components/offer-thread';
import { kindLabels, listingStateLabels } from '../../features/swap-board/swap-board-labels';
import { errorText } from '../../lib/form-errors';
import { useMoney } from '../../lib/money';
import { animalName } from '../../lib/names';
import { listingIdFrom, useListingIdParam } from './swap-board-params';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(listingPageQueryOptions(listingIdFrom(params)));
  return null;
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Card>
      <section aria-label={title} className="space-y-3">
        <h2 className="text-xl font-bold">{title}</h2>
        {children}
      </section>
    </Card>
  );
}

/** One listed animal: the figures a buyer reads first, and its pedigree picture (three generations). */
function ListedAnimal({ animal, papers }: { animal: SwapAnimalDto; papers: boolean }) {
  const tree = useQuery(pedigreeQueryOptions(animal.card.id, 3));
  return (
    <Section title={animalName(animal.card)}>
      <AnimalFigures animal={animal} />
      {papers && <PedigreePdfLink animalId={animal.card.id} />}
      <h3 className="pt-2 font-bold">Pedigree</h3>
      <div data-testid="pedigree-picture" className="min-w-0">
        {tree.data ? <PedigreeTree tree={tree.data} /> : tree.isError ? <Alert tone="error">{errorText(tree.error)}</Alert> : <p className="text-grey-600">Reading the pedigree…</p>}
      </div>
    </Section>
  );
}

/** The seller's own steps: open a draft on the board, or take the listing off it. */
function SellerActions({ listingId, version, state, onEdit }: { listingId: string; version: number; state: string; onEdit: () => void }) {
  const publish = useListingStep(listingId, 'publish');
  const withdraw = useListingStep(listingId, 'withdraw');
  const error = publish.error ?? withdraw.error;
  return (
    <div className="flex flex-wrap gap-2">
      {state === 'draft' && <Button isBusy={publish.isPending} onClick={() => publish.mutate({ version })}>Open it on the board</Button>}
      {['draft', 'open'].includes(state) && <Button variant="secondary" onClick={onEdit}>Edit the listing</Button>}
      {['draft', 'open', 'under_offer'].includes(state) && (
        <Button variant="quiet" isBusy={withdraw.isPending} onClick={() => withdraw.mutate({ version, reason: '' })}>Withdraw the listing</Button>
      )}
      {error && <Alert tone="error">{errorText(error)}</Alert>}
    </div>
  );
}

/** /swap-board/listings/:listingId — the listing, each animal's pedigree picture, the offer thread and the listing's chat. */
export function ListingPage() {
  const listingId = useListingIdParam();
  const money = useMoney();
  const today = useFarmToday();
  const page = useListingPage(listingId);
  const [editing, setEditing] = useState(false);
  if (!page.data) return page.isError ? <Alert tone="error">{errorText(page.error)}</Alert> : <PageSpinner />;
  const { listing, offers } = page.data;
  // Both farms of the sale keep each animal's pedigree certificate, the seller after the animal left.
  const papers = listing.state === 'sold' && (listing.mine || offers.some((o) => o.side === 'buyer' && ['accepted', 'collected'].includes(o.state)));
  return (
    <div className="space-y-6">
      <PageTitle>{listing.title}</PageTitle>
      <LinkButton to="/swap-board" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the board
      </LinkButton>
      <PageHeader
        title={listing.title}
        lead={`${kindLabels[listing.kind]} · ${listing.farm.name}${listing.kind !== 'wanted' ? ` · ${priceText(listing, money)}` : ''}`}
        actions={listing.mine ? <SellerActions listingId={listing.id} version={listing.version} state={listing.state} onEdit={() => setEditing(true)} /> : undefined}
      />
      {editing && listing.mine && ['draft', 'open'].includes(listing.state) && (
        <Section title="Edit the listing">
          <EditListingForm listing={listing} today={today} onDone={() => setEditing(false)} />
        </Section>
      )}
      <div className="flex flex-wrap items-center gap-2">
        <Badge tone={listing.state === 'open' ? 'moss' : 'neutral'}>{listingStateLabels[listing.state]}</Badge>
        <span className="text-grey-700">Listed until {listing.validUntil}</span>
        {listing.collectPlace && <span className="text-grey-700">· Collect at {listing.collectPlace}</span>}
      </div>
      {listing.closedReason && <Alert tone="info">{listing.closedReason}</Alert>}
      <MeatCaution text={listing.caution} />
      {listing.photoIds.length > 0 && (
        <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
          {listing.photoIds.map((id, i) => (
            <img key={id} src={`/api/photos/${id}`} alt={`Photo ${i + 1} of ${listing.title}`} className="aspect-square w-full rounded-lg object-cover" loading="lazy" />
          ))}
        </div>
      )}
      {listing.description && <p className="max-w-prose whitespace-pre-line text-bark">{listing.description}</p>}
      {listing.grownOut && (
        <Section title="The grow-out">
          <p>{listing.grownOut.headCount} head of {listing.grownOut.crossLabel || listing.grownOut.groupName}{listing.grownOut.readyOn ? `, ready about ${listing.grownOut.readyOn}` : ''}.</p>
        </Section>
      )}
      {listing.wanted && (
        <Section title="What is wanted">
          <p>{[listing.wanted.breedName, listing.wanted.sex, listing.wanted.age].filter(Boolean).join(' · ') || 'Any rabbit that fits'}{listing.wanted.by ? `, by ${listing.wanted.by}` : ''}.</p>
          <p className="text-sm text-grey-600">Have one? List it and tell them in the conversation below.</p>
        </Section>
      )}
      <div className={`grid grid-cols-1 gap-6 [&>*]:min-w-0 ${listing.animals.length > 1 ? '2xl:grid-cols-2' : ''}`}>
        {listing.animals.map((a) => (
          <ListedAnimal key={a.card.id} animal={a} papers={papers} />
        ))}
      </div>
      {offers.length > 0 && (
        <section aria-label="Offers" className="space-y-3">
          <h2 className="text-xl font-bold">{listing.mine ? 'Offers' : 'Your offer'}</h2>
          {offers.map((o) => (
            <OfferThread key={o.id} offer={o} today={today} />
          ))}
        </section>
      )}
      {listing.canOffer && !offers.some((o) => o.side === 'buyer' && o.state === 'open') && (
        <Section title="Make an offer">
          <OfferForm listingId={listing.id} today={today} lastDay={listing.validUntil} />
        </Section>
      )}
      {listing.state !== 'draft' && (
        <Section title="Questions and arrangements">
          <ChatThread subject={{ type: 'swap-listing', id: listing.id }} />
        </Section>
      )}
    </div>
  );
}
