import { useState } from 'react';
import { ErrorCode, type ServiceDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { useRecordPalpation } from '../api/record-palpation';
import { fieldErrors } from '../../../lib/form-errors';

/** Kits felt or not: a negative palpation closes the service and plans the rebreed. */
export function PalpationForm({ service, today }: { service: ServiceDto; today: string }) {
  const record = useRecordPalpation(service.id);
  const [palpatedOn, setPalpatedOn] = useState(today);
  const [result, setResult] = useState<'positive' | 'negative' | ''>('');
  const [notes, setNotes] = useState('');
  const errors = fieldErrors(record.error);
  const needsConfirm = isApiError(record.error, ErrorCode.confirmationRequired);
  const send = (confirm: boolean) =>
    record.mutate({ palpatedOn, ...(result ? { result } : {}), notes, ...(confirm ? { confirm: true } : {}) }, { onSuccess: () => setResult('') });
  return (
    <form
      noValidate
      aria-label="Record the palpation"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        send(false);
      }}
    >
      <fieldset className="space-y-1.5">
        <legend className="font-medium">Did you feel kits?</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['positive', 'negative'] as const).map((value) => (
            <label key={value} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" name={`palpation-${service.id}`} value={value} checked={result === value} onChange={() => setResult(value)} className="size-6 accent-moss" />
              <span className="font-medium">{value === 'positive' ? 'Yes, positive' : 'No, empty'}</span>
            </label>
          ))}
        </div>
        {errors.result && <p className="text-sm font-medium text-clay-deep">{errors.result}</p>}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Palpated on" type="date" max={today} value={palpatedOn} onChange={(e) => setPalpatedOn(e.target.value)} error={needsConfirm ? undefined : errors.palpatedOn} />
        <TextField label="Notes (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} />
      </div>
      {needsConfirm && (
        <Alert tone="warning" title="Check before saving" actions={<Button onClick={() => send(true)}>Save anyway</Button>}>
          {errors.palpatedOn}
        </Alert>
      )}
      <Button type="submit" isBusy={record.isPending}>
        Save the palpation
      </Button>
    </form>
  );
}
