import { useState } from 'react';
import type { LitterDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { animalName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { useFosterCandidates } from '../api/get-foster-candidates';
import { useRecordFostering } from '../api/record-fostering';

/**
 * Kits moved to another doe's litter of about the same age, or taken in from one of this farm. A
 * fostering to another farm's litter is recorded here by the giving farm; parentage never changes.
 */
export function FosteringForm({ litter, today }: { litter: LitterDto; today: string }) {
  const candidates = useFosterCandidates(litter.id, true);
  const record = useRecordFostering(litter.id);
  const [direction, setDirection] = useState<'out' | 'in'>('out');
  const [otherLitterId, setOtherLitterId] = useState('');
  const [on, setOn] = useState(today);
  const [count, setCount] = useState('1');
  const errors = fieldErrors(record.error);
  const list = (candidates.data?.candidates ?? []).filter((c) => direction === 'out' || c.isOwnFarm);
  return (
    <form
      noValidate
      aria-label="Record a fostering"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        record.mutate({ direction, otherLitterId, on, count: Number(count === '' ? NaN : count) }, { onSuccess: () => setOtherLitterId('') });
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Which way"
          value={direction}
          onChange={(e) => setDirection(e.target.value as 'out' | 'in')}
          options={[
            { value: 'out', label: 'Fostered out of this litter' },
            { value: 'in', label: 'Fostered in to this litter' },
          ]}
          error={errors.direction}
        />
        <SelectField
          label={direction === 'out' ? 'To the litter of' : 'From the litter of'}
          hint={list.length === 0 ? 'No nursing litter kindled within a week of this one.' : 'Nursing litters kindled within a week of this one; another farm\'s only to foster out to.'}
          value={otherLitterId}
          onChange={(e) => setOtherLitterId(e.target.value)}
          error={errors.otherLitterId}
          options={[
            { value: '', label: 'Choose the other litter' },
            ...list.map((c) => ({
              value: c.id,
              label: `${animalName(c.dam)}, kindled ${formatDate(c.kindledOn)}${c.isOwnFarm ? ` (${c.onDoe} with her)` : ` — ${c.farm.name}`}`,
            })),
          ]}
        />
        <TextField label="On" type="date" max={today} value={on} onChange={(e) => setOn(e.target.value)} error={errors.on} />
        <TextField label="Number of kits" type="number" inputMode="numeric" min={1} value={count} onChange={(e) => setCount(e.target.value)} error={errors.count ?? errors['otherLitter.count']} />
      </div>
      {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the fostering
      </Button>
    </form>
  );
}
