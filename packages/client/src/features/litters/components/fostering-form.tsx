import { useForm } from 'react-hook-form';
import { fosteringCreateSchema, type FosteringCreateInput, type LitterDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { animalName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber } from '../../../lib/typed-number';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useFosterCandidates } from '../api/get-foster-candidates';
import { useRecordFostering } from '../api/record-fostering';

interface FosteringValues {
  direction: 'out' | 'in';
  otherLitterId: string;
  on: string;
  count: string;
}

/** The server also answers for the other litter's count ("otherLitter.count"): that is the count typed here. */
const fieldOf = (path: string) => (path === 'otherLitter.count' ? 'count' : (['direction', 'otherLitterId', 'on', 'count'] as const).find((f) => f === path) ?? null);

/**
 * Kits moved to another doe's litter of about the same age, or taken in from one of this farm. A
 * fostering to another farm's litter is recorded here by the giving farm; parentage never changes.
 */
export function FosteringForm({ litter, today }: { litter: LitterDto; today: string }) {
  const candidates = useFosterCandidates(litter.id, true);
  const record = useRecordFostering(litter.id);
  const form = useForm<FosteringValues, unknown, FosteringCreateInput>({
    resolver: sharedSchemaResolver(fosteringCreateSchema, (v) => ({ ...v, count: typedNumber(v.count) }), fieldOf),
    defaultValues: { direction: 'out', otherLitterId: '', on: today, count: '1' },
  });
  const { errors } = form.formState;
  const direction = form.watch('direction');
  const { submit, failure } = useServerSubmit(form, record, { fields: fieldOf, onSuccess: () => form.setValue('otherLitterId', '') });
  const list = (candidates.data?.candidates ?? []).filter((c) => direction === 'out' || c.isOwnFarm);
  return (
    <form noValidate aria-label="Record a fostering" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Which way"
          options={[
            { value: 'out', label: 'Fostered out of this litter' },
            { value: 'in', label: 'Fostered in to this litter' },
          ]}
          error={errors.direction?.message}
          {...form.register('direction')}
        />
        <SelectField
          label={direction === 'out' ? 'To the litter of' : 'From the litter of'}
          hint={list.length === 0 ? 'No nursing litter kindled within a week of this one.' : 'Nursing litters kindled within a week of this one; another farm\'s only to foster out to.'}
          error={errors.otherLitterId?.message}
          options={[
            { value: '', label: 'Choose the other litter' },
            ...list.map((c) => ({
              value: c.id,
              label: `${animalName(c.dam)}, kindled ${formatDate(c.kindledOn)}${c.isOwnFarm ? ` (${c.onDoe} with her)` : ` — ${c.farm.name}`}`,
            })),
          ]}
          {...form.register('otherLitterId')}
        />
        <TextField label="On" type="date" max={today} error={errors.on?.message} {...form.register('on')} />
        <TextField label="Number of kits" type="number" inputMode="numeric" min={1} error={errors.count?.message} {...form.register('count')} />
      </div>
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the fostering
      </Button>
    </form>
  );
}
