import { useForm } from 'react-hook-form';
import { choreResubmitSchema, gramsToWeightInput, weightInputToGrams, type ChoreEntryDto, type ChoreResubmitInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { WeightInput } from '../../../components/ui/weight-input';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useWeightUnit } from '../../herd';
import { useResubmitChore } from '../api/mentorship-mutations';

interface Values {
  doneOn: string;
  minutes: string;
  notes: string;
  major: string;
  minor: string;
  count: string;
  palpation: '' | 'positive' | 'negative' | 'unsure';
}

const whole = (v: string) => (v.trim() === '' ? undefined : Number(v));

/** A returned entry corrected and sent again: the mentor's comment is above it. */
export function ResubmitForm({ entry, today }: { entry: ChoreEntryDto; today: string }) {
  const resubmit = useResubmitChore(entry.id);
  const unit = useWeightUnit();
  const weight = entry.weighing ? gramsToWeightInput(entry.weighing.totalGrams, unit) : { major: '', minor: '' };
  const form = useForm<Values, unknown, ChoreResubmitInput>({
    resolver: sharedSchemaResolver<Values, ChoreResubmitInput>(choreResubmitSchema, (v) => ({
      doneOn: v.doneOn,
      minutes: whole(v.minutes),
      notes: v.notes,
      weighing: entry.weighing ? { totalGrams: weightInputToGrams(v.major, v.minor, unit) ?? NaN, headCount: entry.weighing.headCount } : undefined,
      litterCount: entry.litterCount ? { kind: entry.litterCount.kind, count: whole(v.count), cause: entry.litterCount.kind === 'lost' ? v.notes || 'See notes' : undefined } : undefined,
      palpation: entry.palpation && v.palpation ? { result: v.palpation } : undefined,
      version: entry.version,
    }) as ChoreResubmitInput, (path) => (path.startsWith('weighing') ? 'major' : path.startsWith('litterCount') ? 'count' : path.startsWith('palpation') ? 'palpation'
      : (['doneOn', 'minutes', 'notes'] as const).find((f) => f === path) ?? null)),
    defaultValues: {
      doneOn: entry.doneOn, minutes: String(entry.minutes), notes: entry.notes,
      major: weight.major, minor: weight.minor, count: entry.litterCount ? String(entry.litterCount.count) : '',
      palpation: entry.palpation?.result ?? '',
    },
  });
  const { submit, failure } = useServerSubmit(form, resubmit, { fields: ['doneOn', 'minutes', 'notes', 'major', 'count', 'palpation'] });
  const errors = form.formState.errors;
  return (
    <form onSubmit={submit} noValidate className="space-y-3 border-t border-grey-200 pt-3" aria-label={`Correct ${entry.kindLabel.toLowerCase()}`}>
      <div className="grid gap-3 sm:grid-cols-3">
        {entry.weighing && (
          <div className="sm:col-span-3">
            <WeightInput label="Corrected weight" unit={unit} error={errors.major?.message} majorProps={form.register('major')} minorProps={form.register('minor')} />
          </div>
        )}
        {entry.litterCount && <TextField label="Corrected kits" inputMode="numeric" error={errors.count?.message} {...form.register('count')} />}
        {entry.palpation && (
          <SelectField
            label="What you felt"
            options={[{ value: 'positive', label: 'Kits felt (positive)' }, { value: 'negative', label: 'Empty (negative)' }, { value: 'unsure', label: 'Not sure' }]}
            error={errors.palpation?.message}
            {...form.register('palpation')}
          />
        )}
        <TextField label="Minutes" inputMode="numeric" error={errors.minutes?.message} {...form.register('minutes')} />
        <TextField label="Date" type="date" max={today} error={errors.doneOn?.message} {...form.register('doneOn')} />
      </div>
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={resubmit.isPending}>Send corrected entry</Button>
    </form>
  );
}
