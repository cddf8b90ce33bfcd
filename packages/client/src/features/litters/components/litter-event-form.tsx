import { useState } from 'react';
import { ErrorCode, weightInputToGrams, type LitterDto, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { useRecordLitterEvent } from '../api/record-litter-event';

const kinds = [
  { value: 'weaned', label: 'Weaned' },
  { value: 'lost', label: 'Lost' },
  { value: 'culled', label: 'Culled' },
] as const;

/**
 * Kits leaving the doe on a date: weaned, lost (with a cause) or culled. The count follows from these. A
 * weaning may carry the litter's total weight, typed in the farm's units (optional).
 */
export function LitterEventForm({ litter, today, isApprentice, unit }: { litter: LitterDto; today: string; isApprentice: boolean; unit: WeightUnit }) {
  const record = useRecordLitterEvent(litter.id);
  const [kind, setKind] = useState<'weaned' | 'lost' | 'culled'>('weaned');
  const [on, setOn] = useState(today);
  const [count, setCount] = useState(String(litter.onDoe || ''));
  const [cause, setCause] = useState('');
  const [major, setMajor] = useState('');
  const [minor, setMinor] = useState('');
  const [weightProblem, setWeightProblem] = useState<string | null>(null);
  const errors = fieldErrors(record.error);
  const needsConfirm = isApiError(record.error, ErrorCode.confirmationRequired);
  const send = (confirm: boolean) => {
    const typed = kind === 'weaned' && (major.trim() !== '' || minor.trim() !== '');
    const weaningWeightGrams = typed ? weightInputToGrams(major, minor, unit) : null;
    if (typed && weaningWeightGrams === null) return setWeightProblem('Enter the litter weight, above zero, or leave it blank');
    setWeightProblem(null);
    record.mutate(
      { kind, on, count: Number(count === '' ? NaN : count), ...(cause ? { cause } : {}), ...(weaningWeightGrams ? { weaningWeightGrams } : {}), ...(confirm ? { confirm: true } : {}) },
      { onSuccess: () => { setCause(''); setMajor(''); setMinor(''); } },
    );
  };
  return (
    <form
      noValidate
      aria-label="Record a change of the kit count"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        send(false);
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField label="What happened" value={kind} onChange={(e) => setKind(e.target.value as typeof kind)} options={kinds} />
        <TextField label="On" type="date" max={today} value={on} onChange={(e) => setOn(e.target.value)} error={errors.on} />
        <TextField label="Kits" type="number" inputMode="numeric" min={1} value={count} onChange={(e) => setCount(e.target.value)} error={errors.count} />
        {kind !== 'weaned' && (
          <TextField label={kind === 'lost' ? 'Cause' : 'Reason (optional)'} value={cause} onChange={(e) => setCause(e.target.value)} error={errors.cause} />
        )}
      </div>
      {kind === 'weaned' && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-bark">Litter weight at weaning (optional): all the kits weaned, together</legend>
          <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
            {unit === 'lb_oz' ? (
              <>
                <TextField label="Pounds" inputMode="decimal" value={major} onChange={(e) => setMajor(e.target.value)} error={weightProblem ?? (needsConfirm ? undefined : errors.weaningWeightGrams)} />
                <TextField label="Ounces" inputMode="decimal" value={minor} onChange={(e) => setMinor(e.target.value)} />
              </>
            ) : (
              <>
                <TextField label="Kilograms" inputMode="decimal" value={major} onChange={(e) => setMajor(e.target.value)} error={weightProblem ?? (needsConfirm ? undefined : errors.weaningWeightGrams)} />
                <TextField label="Grams" inputMode="numeric" value={minor} onChange={(e) => setMinor(e.target.value)} />
              </>
            )}
          </div>
        </fieldset>
      )}
      {needsConfirm && (
        <Alert tone="warning" title="Check before saving" actions={<Button onClick={() => send(true)}>Save anyway</Button>}>
          {errors.weaningWeightGrams}
        </Alert>
      )}
      {isApprentice && <p className="text-sm text-grey-600">Your entry counts as unverified until your mentor reviews it.</p>}
      {record.isError && !needsConfirm && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save
      </Button>
    </form>
  );
}
