import { useState } from 'react';
import { addDays, treatmentRouteLabels, treatmentRoutes, type TreatmentRoute } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField, type SelectOption } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { errorText, fieldErrors } from '../../../lib/form-errors';
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
export function TreatmentForm({ today, animals, groups }: TreatmentFormProps) {
  const record = useRecordTreatment();
  const [subject, setSubject] = useState<'animal' | 'group'>('animal');
  const [animalId, setAnimalId] = useState('');
  const [groupId, setGroupId] = useState('');
  const [treatment, setTreatment] = useState('');
  const [dose, setDose] = useState('');
  const [route, setRoute] = useState<TreatmentRoute | ''>('');
  const [veterinarian, setVeterinarian] = useState('');
  const [startedOn, setStartedOn] = useState(today);
  const [lastDoseOn, setLastDoseOn] = useState(today);
  const [withdrawalBy, setWithdrawalBy] = useState<'date' | 'days'>('days');
  const [withdrawalEndsOn, setWithdrawalEndsOn] = useState('');
  const [withdrawalDays, setWithdrawalDays] = useState('');
  const [notes, setNotes] = useState('');
  const [saved, setSaved] = useState<string | null>(null);
  const errors = fieldErrors(record.error);

  const days = withdrawalDays.trim() === '' ? null : Number(withdrawalDays);
  const endsOn = withdrawalBy === 'date' ? withdrawalEndsOn || null : days !== null && Number.isInteger(days) && days >= 0 && lastDoseOn ? addDays(lastDoseOn, days) : null;

  return (
    <form
      noValidate
      aria-label="Record a treatment"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        setSaved(null);
        record.mutate(
          {
            ...(subject === 'animal' ? { animalId: animalId || undefined } : { groupId: groupId || undefined }),
            treatment, dose, route: (route || undefined) as TreatmentRoute, veterinarian, startedOn, lastDoseOn, notes,
            ...(withdrawalBy === 'date'
              ? { withdrawalEndsOn: withdrawalEndsOn || undefined }
              : { withdrawalDays: withdrawalDays.trim() === '' ? undefined : Number(withdrawalDays) }),
          },
          {
            onSuccess: (t) => {
              setSaved(`Saved: ${t.treatment}, under withdrawal through ${formatDate(t.withdrawalEndsOn)}.`);
              setTreatment('');
              setDose('');
              setNotes('');
            },
          },
        );
      }}
    >
      {groups && (
        <fieldset>
          <legend className="font-medium">Treated</legend>
          <div className="flex flex-wrap gap-x-6">
            {(['animal', 'group'] as const).map((kind) => (
              <label key={kind} className="flex min-h-11 cursor-pointer items-center gap-3">
                <input type="radio" name="treated" className="size-6 accent-moss" checked={subject === kind} onChange={() => setSubject(kind)} />
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
            value={animalId}
            onChange={(e) => setAnimalId(e.target.value)}
            error={errors.animalId}
            options={[{ value: '', label: 'Choose an animal' }, ...animals]}
          />
        ) : (
          <SelectField
            label="Grow-out group"
            value={groupId}
            onChange={(e) => setGroupId(e.target.value)}
            error={errors.groupId ?? errors.animalId}
            options={[{ value: '', label: 'Choose a group' }, ...(groups ?? [])]}
          />
        )}
        <TextField label="Treatment (what was given)" value={treatment} onChange={(e) => setTreatment(e.target.value)} error={errors.treatment} />
        <TextField label="Dose" hint="As the veterinarian prescribed, e.g. 0.2 ml per kg twice a day" value={dose} onChange={(e) => setDose(e.target.value)} error={errors.dose} />
        <SelectField
          label="Route"
          value={route}
          onChange={(e) => setRoute(e.target.value as TreatmentRoute | '')}
          error={errors.route}
          options={[{ value: '', label: 'Choose how it is given' }, ...treatmentRoutes.map((r) => ({ value: r, label: treatmentRouteLabels[r] }))]}
        />
        <TextField label="Prescribed by (veterinarian)" value={veterinarian} onChange={(e) => setVeterinarian(e.target.value)} error={errors.veterinarian} />
        <TextField label="First day of treatment" type="date" max={today} value={startedOn} onChange={(e) => setStartedOn(e.target.value)} error={errors.startedOn} />
        <TextField label="Last day of treatment" type="date" value={lastDoseOn} onChange={(e) => setLastDoseOn(e.target.value)} error={errors.lastDoseOn} />
      </div>
      <fieldset className="space-y-3 rounded-xl border-2 border-oat p-4">
        <legend className="px-1 font-semibold">Withdrawal set by the veterinarian</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['days', 'date'] as const).map((way) => (
            <label key={way} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" name="withdrawal-by" className="size-6 accent-moss" checked={withdrawalBy === way} onChange={() => setWithdrawalBy(way)} />
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
            value={withdrawalDays}
            onChange={(e) => setWithdrawalDays(e.target.value)}
            error={errors.withdrawalDays ?? errors.withdrawalEndsOn}
          />
        ) : (
          <TextField label="Withdrawal ends on" type="date" min={lastDoseOn} value={withdrawalEndsOn} onChange={(e) => setWithdrawalEndsOn(e.target.value)} error={errors.withdrawalEndsOn} />
        )}
        {endsOn && (
          <p className="text-sm text-bark">
            Under withdrawal through <strong>{formatDate(endsOn)}</strong>; it may be processed from {formatDate(addDays(endsOn, 1))}.
          </p>
        )}
      </fieldset>
      <TextField label="Notes (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} error={errors.notes} />
      {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      {saved && <p role="status" className="text-sm font-medium text-moss-deep">{saved}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the treatment
      </Button>
    </form>
  );
}
