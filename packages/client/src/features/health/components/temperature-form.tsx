import { useForm } from 'react-hook-form';
import { temperatureReadingCreateSchema, type TemperatureReadingCreateBody, type TemperatureUnit } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber } from '../../../lib/typed-number';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordTemperature } from '../api/record-temperature';

interface TemperatureValues {
  value: string;
  place: string;
  /** The device's local date and time; blank is now. */
  takenAt: string;
}

/** Logs the barn's temperature in the farm's unit, now or at a time given (members and apprentices). */
export function TemperatureForm({ unit }: { unit: TemperatureUnit }) {
  const record = useRecordTemperature();
  const form = useForm<TemperatureValues, unknown, TemperatureReadingCreateBody>({
    resolver: sharedSchemaResolver(temperatureReadingCreateSchema, (v) => ({
      // A decimal comma is as good as a point.
      value: typedNumber(v.value.replace(',', '.')),
      unit,
      place: v.place,
      ...(v.takenAt ? { takenAt: new Date(v.takenAt).toISOString() } : {}),
    })),
    defaultValues: { value: '', place: 'barn', takenAt: '' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, record, { onSuccess: () => form.reset({ ...form.getValues(), value: '', takenAt: '' }) });
  return (
    <form noValidate aria-label="Log a temperature" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label={`Temperature (°${unit})`} inputMode="decimal" error={errors.value?.message} {...form.register('value')} />
        <TextField label="Where" hint="e.g. barn, hutch row, grow-out pen" error={errors.place?.message} {...form.register('place')} />
        <TextField label="When (blank: now)" type="datetime-local" error={errors.takenAt?.message} {...form.register('takenAt')} />
      </div>
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" variant="secondary" isBusy={record.isPending}>
        Log the temperature
      </Button>
    </form>
  );
}
