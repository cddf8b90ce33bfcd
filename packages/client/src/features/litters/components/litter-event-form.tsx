import { useForm } from 'react-hook-form';
import {
  KIT_DEATH_CAUSE_LABELS, kitDeathCauses, litterEventCreateSchema, weightInputToGrams, type KitDeathCause, type LitterDto, type LitterEventCreateInput, type WeightUnit,
} from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber } from '../../../lib/typed-number';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordLitterEvent } from '../api/record-litter-event';

const kinds = [
  { value: 'weaned', label: 'Weaned' },
  { value: 'lost', label: 'Lost' },
  { value: 'culled', label: 'Culled' },
] as const;

const deathCauseOptions = [{ value: '', label: 'Choose why' }, ...kitDeathCauses.map((c) => ({ value: c, label: KIT_DEATH_CAUSE_LABELS[c] }))];

interface LitterEventValues {
  kind: 'weaned' | 'lost' | 'culled';
  on: string;
  count: string;
  /** Lost kits: why they died, from the list the doe's record counts. */
  deathCause: KitDeathCause | '';
  cause: string;
  /** The litter weight in the farm's units: pounds and ounces, or kilograms and grams. */
  weightMajor: string;
  weightMinor: string;
}

/** The body's weight in grams goes back to the first weight box. */
const fieldOf = (path: string) => (path === 'weaningWeightGrams' ? 'weightMajor' : (['kind', 'on', 'count', 'deathCause', 'cause'] as const).find((f) => f === path) ?? null);

/**
 * Kits leaving the doe on a date: weaned, lost (with a cause) or culled. The count follows from these. A
 * weaning may carry the litter's total weight, typed in the farm's units (optional).
 */
export function LitterEventForm({ litter, today, isApprentice, unit }: { litter: LitterDto; today: string; isApprentice: boolean; unit: WeightUnit }) {
  const record = useRecordLitterEvent(litter.id);
  const form = useForm<LitterEventValues, unknown, LitterEventCreateInput>({
    resolver: sharedSchemaResolver(
      litterEventCreateSchema,
      (v, refuse) => {
        const typed = v.kind === 'weaned' && (v.weightMajor.trim() !== '' || v.weightMinor.trim() !== '');
        const weaningWeightGrams = typed ? weightInputToGrams(v.weightMajor, v.weightMinor, unit) : null;
        if (typed && weaningWeightGrams === null) refuse('weightMajor', 'Enter the litter weight, above zero, or leave it blank');
        return {
          kind: v.kind,
          on: v.on,
          count: typedNumber(v.count),
          ...(v.kind === 'lost' && v.deathCause ? { deathCause: v.deathCause } : {}),
          ...(v.cause && v.kind !== 'weaned' ? { cause: v.cause } : {}),
          ...(weaningWeightGrams ? { weaningWeightGrams } : {}),
        };
      },
      fieldOf,
    ),
    defaultValues: { kind: 'weaned', on: today, count: String(litter.onDoe || ''), deathCause: '', cause: '', weightMajor: '', weightMinor: '' },
  });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const { submit, confirm, warnings, failure } = useServerSubmit(form, record, {
    fields: fieldOf,
    onSuccess: () => form.reset({ ...form.getValues(), deathCause: '', cause: '', weightMajor: '', weightMinor: '' }),
  });
  const weightError = errors.weightMajor?.message;
  return (
    <form noValidate aria-label="Record a change of the kit count" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField label="What happened" options={kinds} error={errors.kind?.message} {...form.register('kind')} />
        <TextField label="On" type="date" max={today} error={errors.on?.message} {...form.register('on')} />
        <TextField label="Kits" type="number" inputMode="numeric" min={1} error={errors.count?.message} {...form.register('count')} />
        {/* A loss with neither a listed cause nor words is refused on its words; the list is where to answer it. */}
        {kind === 'lost' && (
          <SelectField label="Why they died" options={deathCauseOptions} error={errors.deathCause?.message ?? errors.cause?.message} {...form.register('deathCause')} />
        )}
        {kind !== 'weaned' && <TextField label={kind === 'lost' ? 'In your words (optional)' : 'Reason (optional)'} error={kind === 'lost' ? undefined : errors.cause?.message} {...form.register('cause')} />}
      </div>
      {kind === 'weaned' && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-bark">Litter weight at weaning (optional): all the kits weaned, together</legend>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            <TextField label={unit === 'lb_oz' ? 'Pounds' : 'Kilograms'} inputMode="decimal" error={weightError} {...form.register('weightMajor')} />
            <TextField label={unit === 'lb_oz' ? 'Ounces' : 'Grams'} inputMode={unit === 'lb_oz' ? 'decimal' : 'numeric'} {...form.register('weightMinor')} />
          </div>
        </fieldset>
      )}
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={record.isPending} />
      {isApprentice && <p className="text-sm text-grey-600">Your entry counts as unverified until your mentor reviews it.</p>}
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save
      </Button>
    </form>
  );
}
