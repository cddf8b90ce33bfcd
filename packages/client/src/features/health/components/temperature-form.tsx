import { useState } from 'react';
import type { TemperatureUnit } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { useRecordTemperature } from '../api/record-temperature';

/** Logs the barn's temperature in the farm's unit, now or at a time given (members and apprentices). */
export function TemperatureForm({ unit }: { unit: TemperatureUnit }) {
  const record = useRecordTemperature();
  const [value, setValue] = useState('');
  const [place, setPlace] = useState('barn');
  const [takenAt, setTakenAt] = useState('');
  const errors = fieldErrors(record.error);
  return (
    <form
      noValidate
      aria-label="Log a temperature"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        const number = Number(value.trim().replace(',', '.'));
        record.mutate(
          { value: value.trim() === '' ? Number.NaN : number, unit, place, ...(takenAt ? { takenAt: new Date(takenAt).toISOString() } : {}) },
          { onSuccess: () => { setValue(''); setTakenAt(''); } },
        );
      }}
    >
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label={`Temperature (°${unit})`} inputMode="decimal" value={value} onChange={(e) => setValue(e.target.value)} error={errors.value} />
        <TextField label="Where" hint="e.g. barn, hutch row, grow-out pen" value={place} onChange={(e) => setPlace(e.target.value)} error={errors.place} />
        <TextField label="When (blank: now)" type="datetime-local" value={takenAt} onChange={(e) => setTakenAt(e.target.value)} error={errors.takenAt} />
      </div>
      {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      <Button type="submit" variant="secondary" isBusy={record.isPending}>
        Log the temperature
      </Button>
    </form>
  );
}
