import { useForm } from 'react-hook-form';
import {
  animalNoteCreateSchema,
  dispositions,
  lifecycles,
  poundsToGrams,
  statusEventSchema,
  weighInCreateSchema,
  type AnimalNoteCreateInput,
  type StatusEventInput,
  type WeighInCreateInput,
  type WeightUnit,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useFarmToday } from '../../farms';
import { useCreateWeighIn } from '../api/create-weigh-in';
import { useAddAnimalNote, useRecordStatus } from '../api/record-entries';
import { dispositionLabels, lifecycleLabels } from '../herd-labels';

interface WeighInValues {
  /** Pounds or kilograms, as typed. */
  major: string;
  /** Ounces (lb/oz farms only). */
  minor: string;
  weighedOn: string;
}

/** An animal's weigh-in: one head, no note (the schema's defaults). */
type WeighInBody = Omit<WeighInCreateInput, 'headCount' | 'note'> & Partial<WeighInCreateInput>;

/** A weigh-in in the farm's own units; an apprentice's waits for the mentor's review. */
export function WeighInForm({ animalId, unit, isApprentice }: { animalId: string; unit: WeightUnit; isApprentice: boolean }) {
  const save = useCreateWeighIn(animalId);
  const form = useForm<WeighInValues, unknown, WeighInBody>({
    resolver: sharedSchemaResolver(
      weighInCreateSchema,
      (v, refuse) => {
        const a = Number(v.major || 0);
        const b = Number(v.minor || 0);
        const grams = unit === 'lb_oz' ? Math.round(poundsToGrams(a + b / 16)) : Math.round(a * 1000);
        if (!Number.isFinite(grams) || grams <= 0) refuse('major', 'Enter the weight');
        return { animalId, totalGrams: grams, weighedOn: v.weighedOn };
      },
      (path) => (path === 'totalGrams' ? 'major' : path === 'weighedOn' ? 'weighedOn' : null),
    ),
    defaultValues: { major: '', minor: '', weighedOn: useFarmToday() },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, {
    fields: (path) => (path === 'totalGrams' ? 'major' : path === 'weighedOn' ? 'weighedOn' : null),
    onSuccess: () => form.reset({ ...form.getValues(), major: '', minor: '' }),
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Add a weigh-in">
      <div className="grid gap-3 sm:grid-cols-4">
        {unit === 'lb_oz' ? (
          <>
            <TextField label="Pounds" inputMode="numeric" error={errors.major?.message} {...form.register('major')} />
            <TextField label="Ounces" inputMode="decimal" {...form.register('minor')} />
          </>
        ) : (
          <TextField className="sm:col-span-2" label="Kilograms" inputMode="decimal" error={errors.major?.message} {...form.register('major')} />
        )}
        <TextField label="Weighed on" type="date" error={errors.weighedOn?.message} {...form.register('weighedOn')} />
        <div className="flex items-end">
          <Button type="submit" isBusy={save.isPending} className="w-full">
            Save weight
          </Button>
        </div>
      </div>
      {save.isSuccess && <Alert tone="success">{isApprentice ? 'Saved. It shows as unverified until your mentor reviews it.' : 'Weight saved.'}</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
    </form>
  );
}

export function NoteForm({ animalId, isApprentice }: { animalId: string; isApprentice: boolean }) {
  const save = useAddAnimalNote(animalId);
  const today = useFarmToday();
  const form = useForm<{ body: string }, unknown, AnimalNoteCreateInput>({
    // A note is dated the farm's today.
    resolver: sharedSchemaResolver(animalNoteCreateSchema, ({ body }) => ({ body, notedOn: today })),
    defaultValues: { body: '' },
  });
  const { submit } = useServerSubmit(form, save, { onSuccess: () => form.reset({ body: '' }) });
  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Add a note">
      <TextAreaField label="New note" rows={3} error={form.formState.errors.body?.message}
        hint={isApprentice ? 'Your note waits for your mentor to review it.' : undefined} {...form.register('body')} />
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Add note
      </Button>
    </form>
  );
}

interface StatusValues {
  kind: StatusEventInput['kind'];
  value: string;
  cause: string;
  effectiveOn: string;
}

/** Lifecycle or disposition change; a cull needs its cause. */
export function StatusForm({ animalId }: { animalId: string }) {
  const save = useRecordStatus(animalId);
  const form = useForm<StatusValues, unknown, StatusEventInput>({
    resolver: sharedSchemaResolver(statusEventSchema, (v) => ({ kind: v.kind, value: v.value as StatusEventInput['value'], cause: v.cause || undefined, effectiveOn: v.effectiveOn })),
    defaultValues: { kind: 'lifecycle', value: 'breeding', cause: '', effectiveOn: useFarmToday() },
  });
  const { errors } = form.formState;
  const { submit } = useServerSubmit(form, save);
  const kind = form.watch('kind');
  const value = form.watch('value');
  const options = kind === 'lifecycle'
    ? lifecycles.map((v) => ({ value: v, label: lifecycleLabels[v] }))
    : dispositions.filter((d) => d !== 'transferred').map((v) => ({ value: v, label: dispositionLabels[v] }));
  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Record a status change">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField
          label="What changed"
          options={[{ value: 'lifecycle', label: 'Lifecycle' }, { value: 'disposition', label: 'Disposition' }]}
          {...form.register('kind', { onChange: (e) => form.setValue('value', e.target.value === 'lifecycle' ? 'breeding' : 'sold') })}
        />
        <SelectField label="New status" options={options} error={errors.value?.message} {...form.register('value')} />
        <TextField label="Date" type="date" error={errors.effectiveOn?.message} {...form.register('effectiveOn')} />
        <TextField label="Cause or note" error={errors.cause?.message}
          hint={value === 'culled' ? 'Required for a cull' : undefined} {...form.register('cause')} />
      </div>
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Record status
      </Button>
      {save.isSuccess && <Alert tone="success">Status recorded.</Alert>}
    </form>
  );
}
