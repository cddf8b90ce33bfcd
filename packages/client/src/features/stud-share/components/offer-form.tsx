import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { studOfferSchema, type BuckCardDto, type StudOfferBody } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { animalName } from '../../../lib/names';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { breedingStockQueryOptions } from '../../almanac';
import { centsFromText } from '../../ledger';
import { animalPhotosQueryOptions } from '../../photos';
import { useBuckCards } from '../api/get-buck-cards';
import { useOfferBuck, useUpdateOffer } from '../api/save-offer';

interface OfferValues {
  buckId: string;
  loan: boolean;
  service: boolean;
  loanFee: string;
  serviceFee: string;
  longestLoanDays: string;
  restDays: string;
  terms: string;
  travelArea: string;
  lastHealthCheckOn: string;
  rhdv2VaccinatedOn: string;
  knownConditions: string;
  photoIds: string[];
  shareWeights: boolean;
}

const money = (cents: number | null) => (cents ? (cents / 100).toFixed(2) : '');
const feeOf = (text: string) => (text.trim() === '' ? null : centsFromText(text));
const wholeOf = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));

const fieldOf = (path: string) =>
  (({ loanFeeCents: 'loanFee', serviceFeeCents: 'serviceFee' }) as Record<string, keyof OfferValues>)[path] ??
  (['buckId', 'loan', 'service', 'longestLoanDays', 'restDays', 'terms', 'travelArea', 'lastHealthCheckOn', 'rhdv2VaccinatedOn', 'knownConditions', 'photoIds', 'shareWeights'].includes(path.split('.')[0]!)
    ? (path.split('.')[0] as keyof OfferValues)
    : null);

function defaultsOf(card: BuckCardDto | undefined, buckId: string | undefined): OfferValues {
  return {
    buckId: card?.buck.id ?? buckId ?? '',
    loan: card?.loan ?? true,
    service: card?.service ?? false,
    loanFee: money(card?.loanFeeCents ?? null),
    serviceFee: money(card?.serviceFeeCents ?? null),
    longestLoanDays: String(card?.longestLoanDays ?? 42),
    restDays: String(card?.restDays ?? 7),
    terms: card?.terms ?? '',
    travelArea: card?.travelArea ?? '',
    lastHealthCheckOn: card?.health.lastHealthCheckOn ?? '',
    rhdv2VaccinatedOn: card?.health.rhdv2VaccinatedOn ?? '',
    knownConditions: card?.health.knownConditions ?? '',
    photoIds: card?.photos.map((p) => p.id) ?? [],
    shareWeights: card ? card.weights.length > 0 : true,
  };
}

/**
 * Offering a buck (or editing his offer): loan and/or stud service, the fees, how long and how often he
 * travels, the terms, and the health facts a borrower asks for. Whether he is proven comes from the
 * records, never from this form.
 */
export function OfferForm({ card, initialBuckId }: { card?: BuckCardDto; initialBuckId?: string }) {
  const navigate = useNavigate();
  const create = useOfferBuck();
  const update = useUpdateOffer(card?.offerId ?? '', card?.version ?? 0);
  const save = card ? update : create;
  const stock = useQuery({ ...breedingStockQueryOptions(), enabled: !card });
  const form = useForm<OfferValues, unknown, StudOfferBody>({
    resolver: sharedSchemaResolver(
      studOfferSchema,
      (v) => ({
        buckId: v.buckId,
        loan: v.loan,
        service: v.service,
        loanFeeCents: v.loan ? feeOf(v.loanFee) : null,
        serviceFeeCents: v.service ? feeOf(v.serviceFee) : null,
        longestLoanDays: wholeOf(v.longestLoanDays),
        restDays: wholeOf(v.restDays),
        terms: v.terms,
        travelArea: v.travelArea,
        lastHealthCheckOn: v.lastHealthCheckOn || null,
        rhdv2VaccinatedOn: v.rhdv2VaccinatedOn || null,
        knownConditions: v.knownConditions,
        photoIds: v.photoIds,
        shareWeights: v.shareWeights,
      }),
      fieldOf,
    ),
    defaultValues: defaultsOf(card, initialBuckId),
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, {
    fields: fieldOf,
    onSuccess: (saved) => navigate(`/stud-share/bucks/${saved.offerId}`),
  });
  const [buckId, loan, service] = form.watch(['buckId', 'loan', 'service']);
  const photos = useQuery({ ...animalPhotosQueryOptions(buckId), enabled: Boolean(buckId) });
  const offered = useBuckCards({ scope: 'mine', page: 1, pageSize: 100 });
  const offeredIds = new Set((offered.data?.items ?? []).map((c) => c.buck.id));
  const ownBucks = (stock.data?.bucks ?? []).filter((b) => !b.onLoanFrom && !offeredIds.has(b.id));

  return (
    <form noValidate onSubmit={submit} className="space-y-6" aria-label={card ? 'Edit the offer' : 'Offer a buck'}>
      {!card && (
        <SelectField
          label="Buck"
          hint="Your farm's own breeding bucks not offered yet."
          error={errors.buckId?.message}
          options={[{ value: '', label: stock.isPending ? 'Reading your bucks…' : 'Choose a buck' }, ...ownBucks.map((b) => ({ value: b.id, label: animalName(b) }))]}
          {...form.register('buckId')}
        />
      )}
      <fieldset className="space-y-2">
        <legend className="text-lg font-bold">How he is offered</legend>
        <div className="grid gap-4 md:grid-cols-2">
          <div className="space-y-2 rounded-xl border border-grey-200 p-3">
            <CheckboxField label="On loan" hint="He travels to the borrower's farm for the dates agreed." error={errors.loan?.message} {...form.register('loan')} />
            {loan && (
              <>
                <TextField label="Fee per loan (blank: none)" inputMode="decimal" placeholder="0.00" error={errors.loanFee?.message} {...form.register('loanFee')} />
                <div className="grid grid-cols-2 gap-3">
                  <TextField label="Longest loan (days)" inputMode="numeric" error={errors.longestLoanDays?.message} {...form.register('longestLoanDays')} />
                  <TextField label="Rest between loans (days)" inputMode="numeric" error={errors.restDays?.message} {...form.register('restDays')} />
                </div>
                <TextField label="Where he may travel" placeholder="e.g. within the county" error={errors.travelArea?.message} {...form.register('travelArea')} />
              </>
            )}
          </div>
          <div className="space-y-2 rounded-xl border border-grey-200 p-3">
            <CheckboxField label="Stud service" hint="The doe visits him at your farm for a day." error={errors.service?.message} {...form.register('service')} />
            {service && <TextField label="Fee per service (blank: none)" inputMode="decimal" placeholder="0.00" error={errors.serviceFee?.message} {...form.register('serviceFee')} />}
          </div>
        </div>
      </fieldset>
      <TextAreaField label="Terms, in your words" rows={3} placeholder="Feed he is used to, how he travels, what happens if he falls ill…" error={errors.terms?.message} {...form.register('terms')} />
      <fieldset className="space-y-3">
        <legend className="text-lg font-bold">Health facts borrowers ask for</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Last health check" type="date" error={errors.lastHealthCheckOn?.message} {...form.register('lastHealthCheckOn')} />
          <TextField label="RHDV2 vaccination (if any)" type="date" error={errors.rhdv2VaccinatedOn?.message} {...form.register('rhdv2VaccinatedOn')} />
        </div>
        <TextAreaField label="Known conditions" rows={2} placeholder="None known" error={errors.knownConditions?.message} {...form.register('knownConditions')} />
        <p className="text-sm text-grey-600">Whether he is proven is read from the litters on record.</p>
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="text-lg font-bold">What his card shows</legend>
        <CheckboxField label="His weights" {...form.register('shareWeights')} />
        {buckId && (photos.data?.photos.length ?? 0) > 0 ? (
          <ul className="grid grid-cols-3 gap-3 sm:grid-cols-4 lg:grid-cols-6" aria-label="Photos to show">
            {photos.data!.photos.map((p, i) => (
              <li key={p.id}>
                <label className="block cursor-pointer space-y-1">
                  <img src={p.thumbnailUrl} alt={p.caption || `Photo ${i + 1}`} className="aspect-square w-full rounded-lg object-cover" loading="lazy" />
                  <span className="flex min-h-11 items-center gap-2">
                    <input type="checkbox" value={p.id} className="size-6 accent-moss" {...form.register('photoIds')} />
                    Show
                  </span>
                </label>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-grey-600">{buckId ? 'No photos of him yet; add them on his Herd page.' : 'Choose the buck to pick his photos.'}</p>
        )}
        {errors.photoIds && <p className="text-sm font-medium text-clay-deep">{errors.photoIds.message}</p>}
      </fieldset>
      {failure && (
        <Alert tone="error" title="Not saved">
          {failure}
        </Alert>
      )}
      <Button type="submit" isBusy={save.isPending}>
        {card ? 'Save the offer' : 'Offer him to the co-op'}
      </Button>
    </form>
  );
}
