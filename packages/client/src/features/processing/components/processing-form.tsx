import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { dressOut, processingRecordCreateSchema, usdaClass, weightInputToGrams, type ProcessingRecordCreateBody, type WeightUnit } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { SelectField, type SelectOption } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { WeightInput } from '../../../components/ui/weight-input';
import { useRecordProcessing } from '../api/processing-mutations';
import { percent, usdaClassLabels } from '../processing-format';

interface ProcessingFormProps {
  today: string;
  unit: WeightUnit;
  animals: SelectOption[];
  groups: SelectOption[];
  birthDates: Map<string, string | null>;
}

interface ProcessingValues {
  kind: 'animal' | 'group';
  subjectId: string;
  processedOn: string;
  heads: string;
  /** Weights in the farm's units, each as its two boxes. */
  liveMajor: string;
  liveMinor: string;
  hotMajor: string;
  hotMinor: string;
  chilledMajor: string;
  chilledMinor: string;
  notes: string;
}

const processingFields = {
  animalId: 'subjectId', groupId: 'subjectId', processedOn: 'processedOn', headCount: 'heads',
  liveGrams: 'liveMajor', hotCarcassGrams: 'hotMajor', chilledCarcassGrams: 'chilledMajor', notes: 'notes',
} as const;
const fieldOf = (path: string) => processingFields[path as keyof typeof processingFields] ?? null;

const blankWeights = { liveMajor: '', liveMinor: '', hotMajor: '', hotMinor: '', chilledMajor: '', chilledMinor: '' };

/**
 * Records one animal from the Herd or a batch of a grow-out group's heads, in the farm's units. The
 * dress-out and class shown while typing are the ones the server computes and keeps (shared code).
 */
export function ProcessingForm({ today, unit, animals, groups, birthDates }: ProcessingFormProps) {
  const record = useRecordProcessing();
  const headsOf = (v: Pick<ProcessingValues, 'kind' | 'heads'>) => (v.kind === 'animal' ? 1 : Math.max(1, Number.parseInt(v.heads, 10) || 1));
  const form = useForm<ProcessingValues, unknown, ProcessingRecordCreateBody>({
    resolver: sharedSchemaResolver(
      processingRecordCreateSchema,
      (v) => ({
        ...(v.kind === 'animal' ? { animalId: v.subjectId || undefined } : { groupId: v.subjectId || undefined, headCount: headsOf(v) }),
        processedOn: v.processedOn,
        liveGrams: weightInputToGrams(v.liveMajor, v.liveMinor, unit) ?? Number.NaN,
        hotCarcassGrams: weightInputToGrams(v.hotMajor, v.hotMinor, unit) ?? Number.NaN,
        chilledCarcassGrams: weightInputToGrams(v.chilledMajor, v.chilledMinor, unit),
        notes: v.notes,
      }),
      fieldOf,
    ),
    defaultValues: { kind: 'group', subjectId: '', processedOn: today, heads: '1', ...blankWeights, notes: '' },
  });
  const { errors } = form.formState;
  const [saved, setSaved] = useState<string | null>(null);
  const { submit, confirm, warnings, failure } = useServerSubmit(form, record, {
    fields: fieldOf,
    onSuccess: (r) => {
      setSaved(`Saved: dress-out ${percent(r.hotDressOutPercent)}, ${usdaClassLabels[r.usdaClass]}.`);
      form.reset({ ...form.getValues(), ...blankWeights, subjectId: '' });
    },
  });

  const v = form.watch();
  const kind = v.kind;
  const liveGrams = weightInputToGrams(v.liveMajor, v.liveMinor, unit);
  const hotGrams = weightInputToGrams(v.hotMajor, v.hotMinor, unit);
  const chilledGrams = weightInputToGrams(v.chilledMajor, v.chilledMinor, unit);
  const headCount = headsOf(v);
  const preview = liveGrams && hotGrams ? dressOut({ liveGrams, hotCarcassGrams: hotGrams, chilledCarcassGrams: chilledGrams }) : null;
  const classed = preview && !preview.invalid && hotGrams
    ? usdaClass({ birthDate: birthDates.get(v.subjectId) ?? null, processedOn: v.processedOn, carcassGrams: (chilledGrams ?? hotGrams) / headCount })
    : null;

  return (
    <form
      noValidate
      aria-label="Record processing"
      className="space-y-4"
      onSubmit={(e) => {
        setSaved(null);
        return submit(e);
      }}
    >
      <fieldset>
        <legend className="font-medium">Processed</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['group', 'animal'] as const).map((k) => (
            <label key={k} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" value={k} className="size-6 accent-moss" {...form.register('kind', { onChange: () => form.setValue('subjectId', '') })} />
              <span className="font-medium">{k === 'group' ? 'A batch from a grow-out group' : 'One animal from the Herd'}</span>
            </label>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField
          label={kind === 'group' ? 'Grow-out group' : 'Animal'}
          error={errors.subjectId?.message}
          options={[{ value: '', label: kind === 'group' ? 'Choose a group' : 'Choose an animal' }, ...(kind === 'group' ? groups : animals)]}
          {...form.register('subjectId')}
        />
        <TextField label="Processed on" type="date" max={today} error={errors.processedOn?.message} {...form.register('processedOn')} />
        {kind === 'group' && (
          <TextField label="Heads processed" type="number" inputMode="numeric" min={1} error={errors.heads?.message} {...form.register('heads')} />
        )}
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <WeightInput label={kind === 'group' ? 'Live weight, all heads' : 'Live weight'} unit={unit} error={errors.liveMajor?.message} majorProps={form.register('liveMajor')} minorProps={form.register('liveMinor')} />
        <WeightInput label="Hot carcass" unit={unit} error={errors.hotMajor?.message} majorProps={form.register('hotMajor')} minorProps={form.register('hotMinor')} />
        <WeightInput label="Chilled carcass (optional)" unit={unit} error={errors.chilledMajor?.message} majorProps={form.register('chilledMajor')} minorProps={form.register('chilledMinor')} />
      </div>
      {preview && (
        <div aria-live="polite" className="rounded-xl bg-oat/70 p-4">
          <p>
            Dress-out <strong>{percent(preview.hotPercent)}</strong>
            {preview.chilledPercent !== null && <> · chilled <strong>{percent(preview.chilledPercent)}</strong></>}
            {classed && <> · {usdaClassLabels[classed.usdaClass]}</>}
          </p>
          {classed && <p className="text-sm text-grey-600">{classed.reason}{classed.note ? `. ${classed.note}` : ''}</p>}
          {preview.flags.map((f) => (
            <p key={f.code + f.field} className={f.level === 'error' ? 'text-sm font-medium text-clay-deep' : 'text-sm text-bark'}>
              {f.message}
            </p>
          ))}
        </div>
      )}
      <TextField label="Notes (optional)" error={errors.notes?.message} {...form.register('notes')} />
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={record.isPending} />
      {saved && <p role="status" className="text-sm font-medium text-moss-deep">{saved}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the processing record
      </Button>
    </form>
  );
}
