import { useRef, useState } from 'react';
import type { SwapOfferDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { formatInstant } from '../../../lib/dates';
import { errorText } from '../../../lib/form-errors';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { useMoney } from '../../../lib/money';
import { animalName } from '../../../lib/names';
import { useOfferStep } from '../api/swap-actions';
import { offerStateLabels } from '../swap-board-labels';
import { CounterForm } from './offer-form';

function termsText(priceCents: number | null, tradeCount: number, money: (c: number | null) => string): string {
  const parts = [priceCents !== null ? money(priceCents) : null, tradeCount > 0 ? `${tradeCount} animal${tradeCount === 1 ? '' : 's'} in trade` : null].filter(Boolean);
  return parts.join(' and ') || 'Terms for the farms only';
}

/** The steps a party may take now: accept (one transaction that moves the animals), counter, decline, withdraw, confirm the collection. */
function OfferActions({ offer, today }: { offer: SwapOfferDto; today: string }) {
  const acceptKey = useRef(newIdempotencyKey());
  const accept = useOfferStep(offer.id, 'accept');
  const decline = useOfferStep(offer.id, 'decline');
  const withdraw = useOfferStep(offer.id, 'withdraw');
  const collected = useOfferStep(offer.id, 'collected');
  const failed = useOfferStep(offer.id, 'hand-over-failed');
  const [countering, setCountering] = useState(false);
  const error = [accept, decline, withdraw, collected, failed].find((m) => m.error)?.error;
  const { may } = offer;
  if (!Object.values(may).some(Boolean)) return null;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        {may.accept && (
          <Button isBusy={accept.isPending} onClick={() => accept.mutate({ version: offer.version, key: acceptKey.current })}>
            Accept
          </Button>
        )}
        {may.counter && (
          <Button variant="secondary" onClick={() => setCountering((v) => !v)}>
            {countering ? 'Close the counter-offer' : 'Counter-offer'}
          </Button>
        )}
        {may.decline && (
          <Button variant="quiet" isBusy={decline.isPending} onClick={() => decline.mutate({ version: offer.version, reason: '' })}>
            Decline
          </Button>
        )}
        {may.withdraw && (
          <Button variant="quiet" isBusy={withdraw.isPending} onClick={() => withdraw.mutate({ version: offer.version, reason: '' })}>
            Withdraw my offer
          </Button>
        )}
        {may.confirmCollection && (
          <Button isBusy={collected.isPending} onClick={() => collected.mutate({ version: offer.version })}>
            We collected them
          </Button>
        )}
        {may.reportFailed && (
          <Button variant="danger" isBusy={failed.isPending} onClick={() => failed.mutate({ version: offer.version, reason: '' })}>
            The hand-over failed
          </Button>
        )}
      </div>
      {countering && <CounterForm offer={offer} today={today} onDone={() => setCountering(false)} />}
      {error && <Alert tone="error">{errorText(error)}</Alert>}
    </div>
  );
}

/** One offer and its thread of offers, counter-offers and answers, with what the viewer's side may do now. */
export function OfferThread({ offer, today }: { offer: SwapOfferDto; today: string }) {
  const money = useMoney();
  return (
    <Card className="space-y-3" data-testid="offer-thread">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-lg font-bold">{offer.side === 'seller' ? `Offer from ${offer.buyer.name}` : `Your farm's offer to ${offer.seller.name}`}</h3>
        <Badge tone={offer.state === 'open' ? 'straw' : offer.state === 'accepted' || offer.state === 'collected' ? 'moss' : 'neutral'}>{offerStateLabels[offer.state]}</Badge>
      </div>
      <p className="font-semibold">
        {termsText(offer.priceCents, offer.tradeAnimals.length, money)} · stands until {offer.validUntil}
      </p>
      {offer.tradeAnimals.length > 0 && <p className="text-sm text-grey-700">In trade: {offer.tradeAnimals.map(animalName).join(', ')}</p>}
      {offer.state === 'open' && (
        <p className="text-sm text-grey-600">{offer.awaiting === offer.side ? 'Your farm answers next.' : 'Waiting for the other farm.'}</p>
      )}
      {offer.state === 'accepted' && (
        <p className="text-sm text-grey-700">
          The animals are in the buyer's herd, quarantined on arrival. The sale waits in the Ledger until the buyer confirms the collection.
        </p>
      )}
      <ol className="space-y-2 border-l-2 border-grey-200 pl-4">
        {offer.events.map((e) => (
          <li key={e.id} className="text-sm">
            <span className="font-semibold">{e.actorName ?? e.farm?.name ?? 'Burrowline'}</span> · <span className="text-grey-600">{formatInstant(e.at)}</span>
            <p className="break-words text-bark">{e.text}</p>
          </li>
        ))}
      </ol>
      <OfferActions offer={offer} today={today} />
    </Card>
  );
}
