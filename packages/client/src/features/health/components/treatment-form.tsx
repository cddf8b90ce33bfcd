import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { addDays, treatmentCreateSchema, treatmentRouteLabels, treatmentRoutes, type TreatmentCreateBody, type TreatmentRoute } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField, type SelectOption } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordTreatment } from '../api/record-treatment';
import { formatDate } from '../../../lib/days';

interface TreatmentFormProps {
  today: string;
  animals: SelectOption[];
  /** Grow-out groups that can be treated; leave out where only animals are (the breeding screens). */
  groups?: SelectOption[];
}

/**
 * Records a treatment as the veterinarian prescribed it: what, dose, route, who prescribed it, the days
 * of treatment and the withdrawal (its end date, or days after the last dose; 0 when there is none).
 */
interface TreatmentValues {
  subject: 'animal' | 'group';
  animalId: string;
  groupId: string;
  treatment: string;
  dose: string;
  route: TreatmentRoute | '';
  veterinarian: string;
  startedOn: string;
  lastDoseOn: string;
  withdrawalBy: 'date' | 'days';
  withdrawalEndsOn: string;
  withdrawalDays: string;
  notes: string;
}

/** The schema asks for the animal or the group under `animalId`; a group's select shows it too. */
const fieldOf = (path: string) =>
  (['animalId', 'groupId', 'treatment', 'dose', 'route', 'veterinarian', 'startedOn', 'lastDoseOn', 'withdrawalEndsOn', 'withdrawalDays', 'notes'] as const).find((f) => f === path) ?? null;

export function TreatmentForm({ today, animals, groups }: TreatmentFormProps) {
  const record = useRecordTreatment();
  const form = useForm<TreatmentValues, unknown, TreatmentCreateBody>({
    resolver: sharedSchemaResolver(
      treatmentCreateSchema,
      (v) => ({
        ...(v.subject === 'animal' ? { animalId: v.animalId || undefined } : { groupId: v.groupId || undefined }),
        treatment: v.treatment, dose: v.dose, route: (v.route || undefined) as TreatmentRoute, veterinarian: v.veterinarian,
        startedOn: v.startedOn, lastDoseOn: v.lastDoseOn, notes: v.notes,
        ...(v.withdrawalBy === 'date'
          ? { withdrawalEndsOn: v.withdrawalEndsOn || undefined }
          : { withdrawalDays: v.withdrawalDays.trim() === '' ? undefined : Number(v.withdrawalDays) }),
      }),
      (path, values) => (path === 'animalId' && values.subject === 'group' ? 'groupId' : fieldOf(path)),
    ),
    defaultValues: {
      subject: 'animal', animalId: '', groupId: '', treatment: '', dose: '', route: '', veterinarian: '',
      startedOn: today, lastDoseOn: today, withdrawalBy: 'days', withdrawalEndsOn: '', withdrawalDays: '', notes: '',
    },
  });
  const { errors } = form.formState;
  const [saved, setSaved] = useState<string | null>(null);
  const { submit, failure } = useServerSubmit(form, record, {
    fields: (path) => (path === 'animalId' && form.getValues('subject') === 'group' ? 'groupId' : fieldOf(path)),
    onSuccess: (t) => {
      setSaved(`Saved: ${t.treatment}, under withdrawal through ${formatDate(t.withdrawalEndsOn)}.`);
      form.reset({ ...form.getValues(), treatment: '', dose: '', notes: '' });
    },
  });

  const v = form.watch();
  const subject = v.subject;
  const withdrawalBy = v.withdrawalBy;
  const days = v.withdrawalDays.trim() === '' ? null : Number(v.withdrawalDays);
  const endsOn = withdrawalBy === 'date' ? v.withdrawalEndsOn || null : days !== null && Number.isInteger(days) && days >= 0 && v.lastDoseOn ? addDays(v.lastDoseOn, days) : null;

  return (
    <form
      noValidate
      aria-label="Record a treatment"
      className="space-y-4"
      onSubmit={(e) => {
        setSaved(null);
        return submit(e);
      }}
    >
      {groups && (
        <fieldset>
          <legend className="font-medium">Treated</legend>
          <div className="flex flex-wrap gap-x-6">
            {(['animal', 'group'] as const).map((kind) => (
              <label key={kind} className="flex min-h-11 cursor-pointer items-center gap-3">
                <input type="radio" value={kind} className="size-6 accent-moss" {...form.register('subject')} />
                <span className="font-medium">{kind === 'animal' ? 'An animal' : 'A grow-out group'}</span>
              </label>
            ))}
          </div>
        </fieldset>
      )}
      <div className="grid gap-4 md:grid-cols-2">
        {subject === 'animal' ? (
          <SelectField
            label="Animal"
            error={errors.animalId?.message}
            options={[{ value: '', label: 'Choose an animal' }, ...animals]}
            {...form.register('animalId')}
          />
        ) : (
          <SelectField
            label="Grow-out group"
            error={errors.groupId?.message}
            options={[{ value: '', label: 'Choose a group' }, ...(groups ?? [])]}
            {...form.register('groupId')}
          />
        )}
        <TextField label="Treatment (what was given)" error={errors.treatment?.message} {...form.register('treatment')} />
        <TextField label="Dose" hint="As the veterinarian prescribed, e.g. 0.2 ml per kg twice a day" error={errors.dose?.message} {...form.register('dose')} />
        <SelectField
          label="Route"
          error={errors.route?.message}
          options={[{ value: '', label: 'Choose how it is given' }, ...treatmentRoutes.map((r) => ({ value: r, label: treatmentRouteLabels[r] }))]}
          {...form.register('route')}
        />
        <TextField label="Prescribed by (veterinarian)" error={errors.veterinarian?.message} {...form.register('veterinarian')} />
        <TextField label="First day of treatment" type="date" max={today} error={errors.startedOn?.message} {...form.register('startedOn')} />
        <TextField label="Last day of treatment" type="date" error={errors.lastDoseOn?.message} {...form.register('lastDoseOn')} />
      </div>
      <fieldset className="space-y-3 rounded-xl border-2 border-oat p-4">
        <legend className="px-1 font-semibold">Withdrawal set by the veterinarian</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['days', 'date'] as const).map((way) => (
            <label key={way} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" value={way} className="size-6 accent-moss" {...form.register('withdrawalBy')} />
              <span className="font-medium">{way === 'days' ? 'Days after the last dose' : 'Ends on a date'}</span>
            </label>
          ))}
        </div>
        {withdrawalBy === 'days' ? (
          <TextField
            label="Withdrawal days"
            hint="Enter 0 if the veterinarian set no withdrawal"
            type="number"
            inputMode="numeric"
            min={0}
            error={errors.withdrawalDays?.message ?? errors.withdrawalEndsOn?.message}
            {...form.register('withdrawalDays')}
          />
        ) : (
          <TextField label="Withdrawal ends on" type="date" min={v.lastDoseOn} error={errors.withdrawalEndsOn?.message} {...form.register('withdrawalEndsOn')} />
        )}
        {endsOn && (
          <p className="text-sm text-bark">
            Under withdrawal through <strong>{formatDate(endsOn)}</strong>; it may be processed from {formatDate(addDays(endsOn, 1))}.
          </p>
        )}
      </fieldset>
      <TextField label="Notes (optional)" error={errors.notes?.message} {...form.register('notes')} />
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      {saved && <p role="status" className="text-sm font-medium text-moss-deep">{saved}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the treatment
      </Button>
    </form>
  );
}
