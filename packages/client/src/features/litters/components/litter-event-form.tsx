import { useState } from 'react';
import type { LitterDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { errorText, fieldErrors } from '../../almanac/error-text';
import { useRecordLitterEvent } from '../api/record-litter-event';

const kinds = [
  { value: 'weaned', label: 'Weaned' },
  { value: 'lost', label: 'Lost' },
  { value: 'culled', label: 'Culled' },
] as const;

/** Kits leaving the doe on a date: weaned, lost (with a cause) or culled. The count follows from these. */
export function LitterEventForm({ litter, today, isApprentice }: { litter: LitterDto; today: string; isApprentice: boolean }) {
  const record = useRecordLitterEvent(litter.id);
  const [kind, setKind] = useState<'weaned' | 'lost' | 'culled'>('weaned');
  const [on, setOn] = useState(today);
  const [count, setCount] = useState(String(litter.onDoe || ''));
  const [cause, setCause] = useState('');
  const errors = fieldErrors(record.error);
  return (
    <form
      noValidate
      aria-label="Record a change of the kit count"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        record.mutate({ kind, on, count: Number(count === '' ? NaN : count), ...(cause ? { cause } : {}) }, { onSuccess: () => setCause('') });
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
      {isApprentice && <p className="text-sm text-grey-600">Your entry counts as unverified until your mentor reviews it.</p>}
      {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save
      </Button>
    </form>
  );
}
