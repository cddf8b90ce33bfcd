import { useForm } from 'react-hook-form';
import { swapListingEditSchema, type SwapListingDto, type SwapListingEditInput, type SwapPriceMode } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { centsFromText } from '../../ledger';
import { useEditListing } from '../api/swap-actions';
import { priceModeLabels } from '../swap-board-labels';
import { PhotoPicker } from './photo-picker';

interface EditValues {
  title: string;
  description: string;
  priceMode: SwapPriceMode;
  price: string;
  collectPlace: string;
  validUntil: string;
  photoIds: string[];
}

const fieldOf = (path: string): keyof EditValues | null => {
  if (path === 'priceCents') return 'price';
  if (path.startsWith('photoIds')) return 'photoIds';
  const top = path.split('.')[0]!;
  return ['title', 'description', 'priceMode', 'collectPlace', 'validUntil'].includes(top) ? (top as keyof EditValues) : null;
};

/** The seller changes a draft or open listing's words, terms, last day and photos; what it lists stays. */
export function EditListingForm({ listing, today, onDone }: { listing: SwapListingDto; today: string; onDone: () => void }) {
  const edit = useEditListing(listing.id);
  const form = useForm<EditValues, unknown, SwapListingEditInput>({
    resolver: sharedSchemaResolver(swapListingEditSchema, (v) => ({
      version: listing.version,
      title: v.title,
      description: v.description,
      priceMode: listing.kind === 'wanted' ? 'offers' : v.priceMode,
      priceCents: listing.kind !== 'wanted' && v.priceMode === 'price' ? centsFromText(v.price) : null,
      collectPlace: v.collectPlace,
      validUntil: v.validUntil,
      photoIds: v.photoIds,
    }), fieldOf),
    defaultValues: {
      title: listing.title, description: listing.description, priceMode: listing.priceMode,
      price: listing.priceCents === null ? '' : (listing.priceCents / 100).toFixed(2), collectPlace: listing.collectPlace,
      validUntil: listing.validUntil, photoIds: listing.photoIds,
    },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, edit, { fields: fieldOf, onSuccess: onDone });
  const priceMode = form.watch('priceMode');
  return (
    <form noValidate onSubmit={submit} className="space-y-5" aria-label="Edit the listing">
      <TextField label="Title" error={errors.title?.message} {...form.register('title')} />
      <TextAreaField label="Notes for buyers (optional)" rows={3} hint="What buyers read. Your herd's private notes never go with the animal." error={errors.description?.message} {...form.register('description')} />
      {listing.kind !== 'wanted' && (
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="Price" error={errors.priceMode?.message} options={(['price', 'trade', 'offers'] as const).map((m) => ({ value: m, label: priceModeLabels[m] }))} {...form.register('priceMode')} />
          {priceMode === 'price' && <TextField label="Asking price" inputMode="decimal" placeholder="e.g. 65.00" error={errors.price?.message} {...form.register('price')} />}
        </div>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Where to collect (optional)" error={errors.collectPlace?.message} {...form.register('collectPlace')} />
        <TextField label="Listed until" type="date" min={today} error={errors.validUntil?.message} {...form.register('validUntil')} />
      </div>
      {listing.kind === 'breeding_stock' && (
        <PhotoPicker animalIds={listing.animals.map((a) => a.card.id)} field={form.register('photoIds')} error={errors.photoIds?.message ?? errors.photoIds?.root?.message} />
      )}
      {failure && <Alert tone="error" title="Not saved">{failure}</Alert>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isBusy={edit.isPending}>Save the changes</Button>
        <Button type="button" variant="quiet" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
