import { useState, type FormEvent } from 'react';
import { dispositions, lifecycles, poundsToGrams, type StatusEventInput, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { useFarmToday } from '../../farms';
import { useCreateWeighIn } from '../api/create-weigh-in';
import { useAddAnimalNote, useRecordStatus } from '../api/record-entries';
import { dispositionLabels, lifecycleLabels } from '../herd-labels';

function fieldError(error: unknown, field: string): string | undefined {
  return isApiError(error) ? error.details[field]?.[0] : undefined;
}

/** A weigh-in in the farm's own units; an apprentice's waits for the mentor's review. */
export function WeighInForm({ animalId, unit, isApprentice }: { animalId: string; unit: WeightUnit; isApprentice: boolean }) {
  const save = useCreateWeighIn(animalId);
  const [major, setMajor] = useState('');
  const [minor, setMinor] = useState('');
  const [on, setOn] = useState(useFarmToday());
  const [problem, setProblem] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const a = Number(major || 0);
    const b = Number(minor || 0);
    const grams = unit === 'lb_oz' ? Math.round(poundsToGrams(a + b / 16)) : Math.round(a * 1000);
    if (!Number.isFinite(grams) || grams <= 0) return setProblem('Enter the weight');
    setProblem(null);
    save.mutate({ animalId, totalGrams: grams, weighedOn: on }, { onSuccess: () => { setMajor(''); setMinor(''); } });
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Add a weigh-in">
      <div className="grid gap-3 sm:grid-cols-4">
        {unit === 'lb_oz' ? (
          <>
            <TextField label="Pounds" inputMode="numeric" value={major} onChange={(e) => setMajor(e.target.value)} error={problem ?? fieldError(save.error, 'totalGrams')} />
            <TextField label="Ounces" inputMode="decimal" value={minor} onChange={(e) => setMinor(e.target.value)} />
          </>
        ) : (
          <TextField className="sm:col-span-2" label="Kilograms" inputMode="decimal" value={major} onChange={(e) => setMajor(e.target.value)} error={problem ?? fieldError(save.error, 'totalGrams')} />
        )}
        <TextField label="Weighed on" type="date" value={on} onChange={(e) => setOn(e.target.value)} error={fieldError(save.error, 'weighedOn')} />
        <div className="flex items-end">
          <Button type="submit" isBusy={save.isPending} className="w-full">
            Save weight
          </Button>
        </div>
      </div>
      {save.isSuccess && <Alert tone="success">{isApprentice ? 'Saved. It shows as unverified until your mentor reviews it.' : 'Weight saved.'}</Alert>}
      {save.isError && !fieldError(save.error, 'weighedOn') && <Alert tone="error">{save.error.message}</Alert>}
    </form>
  );
}

export function NoteForm({ animalId, isApprentice }: { animalId: string; isApprentice: boolean }) {
  const save = useAddAnimalNote(animalId);
  const [body, setBody] = useState('');
  const today = useFarmToday();
  const submit = (event: FormEvent) => {
    event.preventDefault();
    save.mutate({ body, notedOn: today }, { onSuccess: () => setBody('') });
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Add a note">
      <TextAreaField label="New note" rows={3} value={body} onChange={(e) => setBody(e.target.value)} error={fieldError(save.error, 'body')}
        hint={isApprentice ? 'Your note waits for your mentor to review it.' : undefined} />
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Add note
      </Button>
    </form>
  );
}

/** Lifecycle or disposition change; a cull needs its cause. */
export function StatusForm({ animalId }: { animalId: string }) {
  const save = useRecordStatus(animalId);
  const [kind, setKind] = useState<StatusEventInput['kind']>('lifecycle');
  const [value, setValue] = useState<string>('breeding');
  const [cause, setCause] = useState('');
  const [on, setOn] = useState(useFarmToday());
  const options = kind === 'lifecycle'
    ? lifecycles.map((v) => ({ value: v, label: lifecycleLabels[v] }))
    : dispositions.filter((d) => d !== 'transferred').map((v) => ({ value: v, label: dispositionLabels[v] }));
  const submit = (event: FormEvent) => {
    event.preventDefault();
    save.mutate({ kind, value: value as StatusEventInput['value'], cause: cause || undefined, effectiveOn: on });
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Record a status change">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField
          label="What changed"
          value={kind}
          onChange={(e) => {
            const next = e.target.value as StatusEventInput['kind'];
            setKind(next);
            setValue(next === 'lifecycle' ? 'breeding' : 'sold');
          }}
          options={[{ value: 'lifecycle', label: 'Lifecycle' }, { value: 'disposition', label: 'Disposition' }]}
        />
        <SelectField label="New status" value={value} onChange={(e) => setValue(e.target.value)} options={options} error={fieldError(save.error, 'value')} />
        <TextField label="Date" type="date" value={on} onChange={(e) => setOn(e.target.value)} error={fieldError(save.error, 'effectiveOn')} />
        <TextField label="Cause or note" value={cause} onChange={(e) => setCause(e.target.value)} error={fieldError(save.error, 'cause')}
          hint={value === 'culled' ? 'Required for a cull' : undefined} />
      </div>
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Record status
      </Button>
      {save.isSuccess && <Alert tone="success">Status recorded.</Alert>}
    </form>
  );
}
