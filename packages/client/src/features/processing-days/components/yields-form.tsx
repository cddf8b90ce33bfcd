import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { dayYieldCreateSchema, dressOut, weightInputToGrams, type BookingDto, type DayYieldCreateInput, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { WeightInput } from '../../../components/ui/weight-input';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordYield } from '../api/processing-day-mutations';

interface Values {
  line: string;
  heads: string;
  liveMajor: string;
  liveMinor: string;
  hotMajor: string;
  hotMinor: string;
  chilledMajor: string;
  chilledMinor: string;
  trimmed: string;
  condemned: string;
  reason: string;
}

const fields = {
  groupId: 'line', animalId: 'line', headCount: 'heads', liveGrams: 'liveMajor', hotCarcassGrams: 'hotMajor', chilledCarcassGrams: 'chilledMajor',
  trimmedHead: 'trimmed', condemnedHead: 'condemned', outcomeReason: 'reason',
} as const;
const fieldOf = (path: string) => fields[path.split('.')[0] as keyof typeof fields] ?? null;
const blank = { liveMajor: '', liveMinor: '', hotMajor: '', hotMinor: '', chilledMajor: '', chilledMinor: '', trimmed: '0', condemned: '0', reason: '' };
const whole = (text: string) => (text.trim() === '' ? 0 : Number(text));

/**
 * The yields of one batch of a booking, saved as the farm's processing record (the same record and checks as
 * Grow-out → Processing), linked to the day: weights, and the carcasses trimmed or condemned with the reason.
 */
export function YieldsForm({ dayId, booking, unit }: { dayId: string; booking: BookingDto; unit: WeightUnit }) {
  const save = useRecordYield(dayId);
  const [saved, setSaved] = useState<string | null>(null);
  const lineOf = (key: string) => booking.lines.find((l) => (l.groupId ?? l.animalId) === key);
  const form = useForm<Values, unknown, DayYieldCreateInput>({
    resolver: sharedSchemaResolver(
      dayYieldCreateSchema,
      (v) => {
        const line = lineOf(v.line);
        return {
          bookingId: booking.id,
          ...(line?.animalId ? { animalId: line.animalId } : { groupId: line?.groupId ?? undefined }),
          headCount: line?.animalId ? 1 : whole(v.heads),
          liveGrams: weightInputToGrams(v.liveMajor, v.liveMinor, unit) ?? Number.NaN,
          hotCarcassGrams: weightInputToGrams(v.hotMajor, v.hotMinor, unit) ?? Number.NaN,
          chilledCarcassGrams: weightInputToGrams(v.chilledMajor, v.chilledMinor, unit),
          trimmedHead: whole(v.trimmed),
          condemnedHead: whole(v.condemned),
          outcomeReason: v.reason,
          notes: '',
        } as DayYieldCreateInput;
      },
      fieldOf,
    ),
    defaultValues: { line: booking.lines[0] ? (booking.lines[0].groupId ?? booking.lines[0].animalId ?? '') : '', heads: String(booking.lines[0]?.head ?? 1), ...blank },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, {
    fields: fieldOf,
    onSuccess: (r) => {
      setSaved(`Saved: ${r.headCount} head, dress-out ${r.hotDressOutPercent.toFixed(1)} %.`);
      form.reset({ ...form.getValues(), ...blank });
    },
  });
  const v = form.watch();
  const live = weightInputToGrams(v.liveMajor, v.liveMinor, unit);
  const hot = weightInputToGrams(v.hotMajor, v.hotMinor, unit);
  const preview = live && hot ? dressOut({ liveGrams: live, hotCarcassGrams: hot, chilledCarcassGrams: null }) : null;
  const isAnimal = Boolean(lineOf(v.line)?.animalId);
  return (
    <form noValidate onSubmit={(e) => { setSaved(null); return submit(e); }} aria-label={`Yields of ${booking.farmName}`} className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Batch" error={errors.line?.message} options={booking.lines.map((l) => ({ value: l.groupId ?? l.animalId ?? '', label: `${l.label} (${l.head})` }))} {...form.register('line')} />
        {!isAnimal && <TextField label="Head in this batch" type="number" inputMode="numeric" min={1} error={errors.heads?.message} {...form.register('heads')} />}
      </div>
      <div className="grid gap-3 md:grid-cols-3">
        <WeightInput label={isAnimal ? 'Live' : 'Live, all head'} unit={unit} error={errors.liveMajor?.message} majorProps={form.register('liveMajor')} minorProps={form.register('liveMinor')} />
        <WeightInput label="Hot carcass" unit={unit} error={errors.hotMajor?.message} majorProps={form.register('hotMajor')} minorProps={form.register('hotMinor')} />
        <WeightInput label="Chilled (optional)" unit={unit} error={errors.chilledMajor?.message} majorProps={form.register('chilledMajor')} minorProps={form.register('chilledMinor')} />
      </div>
      {preview && !preview.invalid && preview.hotPercent !== null && <p aria-live="polite" className="rounded-lg bg-oat/70 px-3 py-2">Dress-out <strong>{preview.hotPercent.toFixed(1)} %</strong></p>}
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-[8rem_8rem_minmax(0,1fr)]">
        <TextField label="Trimmed" type="number" inputMode="numeric" min={0} error={errors.trimmed?.message} {...form.register('trimmed')} />
        <TextField label="Condemned" type="number" inputMode="numeric" min={0} error={errors.condemned?.message} {...form.register('condemned')} />
        <TextField className="col-span-2 sm:col-span-1" label="Why trimmed or condemned" error={errors.reason?.message} {...form.register('reason')} />
      </div>
      {failure && <Alert tone="error">{failure}</Alert>}
      {saved && <Alert tone="success">{saved}</Alert>}
      <Button type="submit" isBusy={save.isPending}>Save the yields</Button>
    </form>
  );
}
