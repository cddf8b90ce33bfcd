import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import {
  addDays, swapListingSchema, swapWantedAges, type SwapListingInput, type SwapListingKind, type SwapPriceMode, type SwapWantedAge,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { RadioGroup } from '../../../components/ui/radio-group';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { animalName } from '../../../lib/names';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { breedingStockQueryOptions } from '../../almanac';
import { breedsQueryOptions } from '../../herd';
import { centsFromText } from '../../ledger';
import { useCreateListing } from '../api/swap-actions';
import { kindLabels, priceModeLabels } from '../swap-board-labels';
import { MeatCaution } from './meat-caution';
import { PhotoPicker, useAnimalsPhotos } from './photo-picker';

interface ListingValues {
  kind: SwapListingKind;
  title: string;
  description: string;
  priceMode: SwapPriceMode;
  price: string;
  collectPlace: string;
  validUntil: string;
  animalIds: string[];
  photoIds: string[];
  groupId: string;
  headCount: string;
  readyOn: string;
  wantedBreedId: string;
  wantedSex: '' | 'doe' | 'buck';
  wantedAge: '' | SwapWantedAge;
  wantedBy: string;
  publish: boolean;
}

const fieldOf = (path: string): keyof ListingValues | null => {
  if (path === 'priceCents') return 'price';
  if (path.startsWith('animalIds')) return 'animalIds';
  if (path.startsWith('photoIds')) return 'photoIds';
  const top = path.split('.')[0]!;
  return ['kind', 'title', 'description', 'priceMode', 'collectPlace', 'validUntil', 'groupId', 'headCount', 'readyOn', 'wantedBreedId', 'wantedSex', 'wantedAge', 'wantedBy']
    .includes(top) ? (top as keyof ListingValues) : null;
};

/**
 * Lists breeding stock of the farm's herd, a count of grow-out, or what the farm wants. Animals under a
 * withdrawal, in quarantine, on loan or not the farm's own are refused by the server with the reason.
 */
export function ListingForm({ today, groups }: { today: string; groups: { id: string; name: string }[] }) {
  const navigate = useNavigate();
  const create = useCreateListing();
  const id = useRef(newIdempotencyKey());
  const stock = useQuery(breedingStockQueryOptions());
  const breeds = useQuery(breedsQueryOptions());
  const animals = [...(stock.data?.does ?? []), ...(stock.data?.bucks ?? [])];
  const form = useForm<ListingValues, unknown, SwapListingInput>({
    resolver: sharedSchemaResolver(swapListingSchema, (v) => ({
      id: id.current,
      kind: v.kind,
      title: v.title,
      description: v.description,
      priceMode: v.kind === 'wanted' ? 'offers' : v.priceMode,
      priceCents: v.kind !== 'wanted' && v.priceMode === 'price' ? centsFromText(v.price) : null,
      collectPlace: v.collectPlace,
      validUntil: v.validUntil,
      animalIds: v.kind === 'breeding_stock' ? v.animalIds : [],
      photoIds: v.kind === 'breeding_stock' ? v.photoIds : [],
      shareWeights: true,
      groupId: v.kind === 'grow_out' && v.groupId ? v.groupId : null,
      headCount: v.kind === 'grow_out' && v.headCount ? Number(v.headCount) : null,
      readyOn: v.kind === 'grow_out' && v.readyOn ? v.readyOn : null,
      wantedBreedId: v.kind === 'wanted' && v.wantedBreedId ? v.wantedBreedId : null,
      wantedSex: v.kind === 'wanted' && v.wantedSex ? v.wantedSex : null,
      wantedAge: v.kind === 'wanted' && v.wantedAge ? v.wantedAge : null,
      wantedBy: v.kind === 'wanted' && v.wantedBy ? v.wantedBy : null,
      publish: v.publish,
    }), fieldOf),
    defaultValues: {
      kind: 'breeding_stock', title: '', description: '', priceMode: 'price', price: '', collectPlace: '', validUntil: addDays(today, 30),
      animalIds: [], photoIds: [], groupId: '', headCount: '', readyOn: '', wantedBreedId: '', wantedSex: '', wantedAge: '', wantedBy: '', publish: true,
    },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, create, { fields: fieldOf, onSuccess: (listing) => navigate(`/swap-board/listings/${listing.id}`) });
  const [kind, priceMode, chosen] = form.watch(['kind', 'priceMode', 'animalIds']);
  const { photos } = useAnimalsPhotos(chosen ?? []);
  const pickable = photos.map((p) => p.id).join(',');
  // Unticking an animal drops its photos from the listing.
  useEffect(() => {
    const keep = new Set(pickable.split(','));
    const picked = form.getValues('photoIds');
    if (picked.some((id) => !keep.has(id))) form.setValue('photoIds', picked.filter((id) => keep.has(id)));
  }, [pickable, form]);
  return (
    <form noValidate onSubmit={submit} className="space-y-5" aria-label="New listing">
      <RadioGroup
        legend="What you list"
        inline
        error={errors.kind?.message}
        options={(['breeding_stock', 'grow_out', 'wanted'] as const).map((k) => ({ value: k, label: kindLabels[k] }))}
        {...form.register('kind')}
      />
      <TextField label="Title" placeholder={kind === 'wanted' ? 'Wanted: a New Zealand buck' : 'Junior doe from a good mothering line'} error={errors.title?.message} {...form.register('title')} />
      <TextAreaField label="Notes for buyers (optional)" rows={3} hint="What buyers read. Your herd's private notes never go with the animal." error={errors.description?.message} {...form.register('description')} />
      {kind === 'breeding_stock' && (
        <fieldset className="space-y-1">
          <legend className="font-medium">The animals</legend>
          {animals.length === 0 ? (
            <p className="text-sm text-grey-600">{stock.isPending ? 'Reading your herd…' : 'Your farm has no breeding stock on record.'}</p>
          ) : (
            <div className="grid gap-x-4 sm:grid-cols-2">
              {animals.map((a) => (
                <CheckboxField key={a.id} label={animalName(a)} value={a.id} {...form.register('animalIds')} />
              ))}
            </div>
          )}
          {errors.animalIds && <p className="text-sm font-medium text-clay-deep">{errors.animalIds.message ?? errors.animalIds.root?.message}</p>}
        </fieldset>
      )}
      {kind === 'breeding_stock' && (
        <PhotoPicker animalIds={chosen ?? []} field={form.register('photoIds')} error={errors.photoIds?.message ?? errors.photoIds?.root?.message} />
      )}
      {kind === 'grow_out' && (
        <>
          <MeatCaution />
          <div className="grid gap-4 sm:grid-cols-3">
            <SelectField label="Grow-out group" error={errors.groupId?.message} options={[{ value: '', label: 'Choose a group' }, ...groups.map((g) => ({ value: g.id, label: g.name }))]} {...form.register('groupId')} />
            <TextField label="Head" inputMode="numeric" error={errors.headCount?.message} {...form.register('headCount')} />
            <TextField label="Ready about (optional)" type="date" error={errors.readyOn?.message} {...form.register('readyOn')} />
          </div>
        </>
      )}
      {kind === 'wanted' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Breed (optional)" error={errors.wantedBreedId?.message} options={[{ value: '', label: 'Any breed' }, ...(breeds.data ?? []).map((b) => ({ value: b.id, label: b.name }))]} {...form.register('wantedBreedId')} />
          <SelectField label="Sex (optional)" options={[{ value: '', label: 'Either' }, { value: 'doe', label: 'Doe' }, { value: 'buck', label: 'Buck' }]} {...form.register('wantedSex')} />
          <SelectField label="Age (optional)" options={[{ value: '', label: 'Any age' }, ...swapWantedAges.map((a) => ({ value: a, label: a[0]!.toUpperCase() + a.slice(1) }))]} {...form.register('wantedAge')} />
          <TextField label="Wanted by (optional)" type="date" error={errors.wantedBy?.message} {...form.register('wantedBy')} />
        </div>
      )}
      {kind !== 'wanted' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Price" error={errors.priceMode?.message} options={(['price', 'trade', 'offers'] as const).map((m) => ({ value: m, label: priceModeLabels[m] }))} {...form.register('priceMode')} />
          {priceMode === 'price' && <TextField label="Asking price" inputMode="decimal" placeholder="e.g. 65.00" error={errors.price?.message} {...form.register('price')} />}
        </div>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Where to collect (optional)" placeholder="Farm gate, Saturdays" error={errors.collectPlace?.message} {...form.register('collectPlace')} />
        <TextField label="Listed until" type="date" min={today} error={errors.validUntil?.message} {...form.register('validUntil')} />
      </div>
      <CheckboxField label="Open it on the board now (otherwise it stays a draft)" {...form.register('publish')} />
      {failure && <Alert tone="error" title="Not listed">{failure}</Alert>}
      <Button type="submit" isBusy={create.isPending}>List it</Button>
    </form>
  );
}
