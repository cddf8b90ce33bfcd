import { useForm } from 'react-hook-form';
import { keeperCreateSchema, type KeeperCreateInput, type LitterDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { animalName } from '../../../lib/names';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useAddKeeper } from '../api/add-keeper';

interface KeeperValues {
  tattoo: string;
  name: string;
  sex: 'doe' | 'buck';
  bornInLitterId: string;
}

/** A kit kept for breeding gets its own record; its sire, dam and birth date come from the litter it was born in. */
export function KeeperForm({ litter }: { litter: LitterDto }) {
  const add = useAddKeeper(litter.id);
  const form = useForm<KeeperValues, unknown, KeeperCreateInput>({
    resolver: sharedSchemaResolver(keeperCreateSchema, ({ tattoo, name, sex, bornInLitterId }) => ({
      tattoo,
      name,
      sex,
      colour: '',
      // This litter is the default; only a kit fostered in names the litter it was born in.
      ...(bornInLitterId !== litter.id ? { bornInLitterId } : {}),
    })),
    defaultValues: { tattoo: '', name: '', sex: 'doe', bornInLitterId: litter.id },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, add, { onSuccess: () => form.reset({ ...form.getValues(), tattoo: '', name: '' }) });
  return (
    <form noValidate aria-label="Keep a kit" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Ear tattoo" error={errors.tattoo?.message} {...form.register('tattoo')} />
        <TextField label="Name (optional)" error={errors.name?.message} {...form.register('name')} />
        <SelectField label="Sex" options={[{ value: 'doe', label: 'Doe' }, { value: 'buck', label: 'Buck' }]} error={errors.sex?.message} {...form.register('sex')} />
        {litter.fosteredInFrom.length > 0 && (
          <SelectField
            label="Born in"
            error={errors.bornInLitterId?.message}
            options={[
              { value: litter.id, label: `This litter (${animalName(litter.dam)})` },
              ...litter.fosteredInFrom.map((l) => ({ value: l.id, label: `Fostered in: ${l.dam ? animalName(l.dam) : 'another doe'}'s litter` })),
            ]}
            {...form.register('bornInLitterId')}
          />
        )}
      </div>
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" variant="secondary" isBusy={add.isPending}>
        Keep this kit
      </Button>
    </form>
  );
}
