import { useQuery } from '@tanstack/react-query';
import { useRef } from 'react';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { addDays, swapCounterSchema, swapOfferSchema, type SwapCounterInput, type SwapOfferDto, type SwapOfferInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { animalName } from '../../../lib/names';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { breedingStockQueryOptions } from '../../almanac';
import { centsFromText } from '../../ledger';
import { useMakeOffer, useOfferStep } from '../api/swap-actions';

interface TermsValues {
  price: string;
  tradeAnimalIds: string[];
  message: string;
  validUntil: string;
}

const priceOf = (text: string) => (text.trim() === '' ? null : centsFromText(text));
const fieldOf = (path: string): keyof TermsValues | null =>
  path === 'priceCents' ? 'price' : path.startsWith('tradeAnimalIds') ? 'tradeAnimalIds' : (['message', 'validUntil'].includes(path) ? (path as keyof TermsValues) : null);

/** The terms of an offer or a counter-offer: a price, animals of the buyer's herd in trade, or both. */
function TermsFields<TBody>({ form, tradeFromMyHerd }: { form: UseFormReturn<TermsValues, unknown, TBody>; tradeFromMyHerd: boolean }) {
  const stock = useQuery({ ...breedingStockQueryOptions(), enabled: tradeFromMyHerd });
  const animals = [...(stock.data?.does ?? []), ...(stock.data?.bucks ?? [])];
  const { errors } = form.formState;
  return (
    <>
      <TextField label="Price (leave empty for a trade only)" inputMode="decimal" placeholder="e.g. 60.00" error={errors.price?.message} {...form.register('price')} />
      {tradeFromMyHerd && (
        <details className="rounded-lg border border-grey-200 p-3" open={form.getValues('tradeAnimalIds').length > 0}>
          <summary className="min-h-11 cursor-pointer content-center font-medium">Animals of your herd in trade (optional)</summary>
          {animals.length === 0 ? (
            <p className="text-sm text-grey-600">{stock.isPending ? 'Reading your herd…' : 'No breeding stock on record.'}</p>
          ) : (
            <div className="grid gap-x-4 sm:grid-cols-2">
              {animals.map((a) => (
                <CheckboxField key={a.id} label={animalName(a)} value={a.id} {...form.register('tradeAnimalIds')} />
              ))}
            </div>
          )}
          {errors.tradeAnimalIds && <p className="text-sm font-medium text-clay-deep">{errors.tradeAnimalIds.message ?? errors.tradeAnimalIds.root?.message}</p>}
        </details>
      )}
      <TextField label="The offer stands until" type="date" error={errors.validUntil?.message} {...form.register('validUntil')} />
      <TextAreaField label="Message (optional)" rows={3} placeholder="When you could collect, what you would like to know…" error={errors.message?.message} {...form.register('message')} />
    </>
  );
}

/** A member's offer on another farm's listing; the seller is told at once. */
export function OfferForm({ listingId, today, lastDay, onDone }: { listingId: string; today: string; lastDay: string; onDone?: (offer: SwapOfferDto) => void }) {
  const offer = useMakeOffer();
  const id = useRef(newIdempotencyKey());
  const form = useForm<TermsValues, unknown, SwapOfferInput>({
    resolver: sharedSchemaResolver(swapOfferSchema, (v) => ({
      id: id.current, listingId, priceCents: priceOf(v.price), tradeAnimalIds: v.tradeAnimalIds, message: v.message, validUntil: v.validUntil,
    }), fieldOf),
    defaultValues: { price: '', tradeAnimalIds: [], message: '', validUntil: addDays(today, 7) < lastDay ? addDays(today, 7) : lastDay },
  });
  const { submit, failure } = useServerSubmit(form, offer, { fields: fieldOf, onSuccess: (made) => { id.current = newIdempotencyKey(); form.reset(); onDone?.(made); } });
  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label="Make an offer">
      <TermsFields form={form} tradeFromMyHerd />
      {failure && <Alert tone="error" title="Not sent">{failure}</Alert>}
      <Button type="submit" isBusy={offer.isPending}>Send the offer</Button>
    </form>
  );
}

/** New terms from the side whose turn it is; the other side answers next. */
export function CounterForm({ offer, today, onDone }: { offer: SwapOfferDto; today: string; onDone: () => void }) {
  const counter = useOfferStep(offer.id, 'counter');
  const form = useForm<TermsValues, unknown, SwapCounterInput>({
    resolver: sharedSchemaResolver(swapCounterSchema, (v) => ({
      version: offer.version, priceCents: priceOf(v.price), tradeAnimalIds: v.tradeAnimalIds, message: v.message, validUntil: v.validUntil,
    }), fieldOf),
    defaultValues: {
      price: offer.priceCents === null ? '' : (offer.priceCents / 100).toFixed(2),
      tradeAnimalIds: offer.tradeAnimals.map((a) => a.id),
      message: '',
      validUntil: offer.validUntil < today ? today : offer.validUntil,
    },
  });
  const { submit, failure } = useServerSubmit(form, counter, { fields: fieldOf, onSuccess: onDone });
  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label="Counter-offer">
      <TermsFields form={form} tradeFromMyHerd={offer.side === 'buyer'} />
      {failure && <Alert tone="error" title="Not sent">{failure}</Alert>}
      <Button type="submit" isBusy={counter.isPending}>Send the counter-offer</Button>
    </form>
  );
}
