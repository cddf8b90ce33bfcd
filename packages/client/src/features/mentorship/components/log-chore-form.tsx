import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { choreEntrySchema, dangerousSkillCaution, weightInputToGrams, type ChoreEntryInput, type ChoreKind } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { WeightInput } from '../../../components/ui/weight-input';
import { cn } from '../../../lib/cn';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useWeightUnit } from '../../herd';
import { useLogChore } from '../api/mentorship-mutations';
import type { ChoreChoices } from '../api/mentorship-queries';

interface Values {
  kind: string;
  minutes: string;
  doneOn: string;
  target: string;
  notes: string;
  /** The weight in the farm's units: pounds and ounces, or kilograms and grams. */
  major: string;
  minor: string;
  heads: string;
  litterKind: '' | 'lost' | 'culled' | 'weaned';
  litterCount: string;
  cause: string;
  /** A palpation's result: it goes on the doe's open service once the mentor accepts it. */
  palpation: '' | 'positive' | 'negative' | 'unsure';
}

const palpationChoices = [
  { value: 'positive', label: 'Kits felt' },
  { value: 'negative', label: 'Empty' },
  { value: 'unsure', label: 'Not sure' },
] as const;

const quickMinutes = ['10', '15', '30', '60'];
const whole = (v: string) => (v.trim() === '' ? undefined : Number(v));

/** Chips for a one-tap choice (a chore, the minutes): 44 px tall, wrap on a phone. */
function Chip({ active, onClick, children }: { active: boolean; onClick: () => void; children: string }) {
  return (
    <button
      type="button"
      aria-pressed={active}
      onClick={onClick}
      className={cn(
        'min-h-11 rounded-xl border-2 px-3 py-2 text-left font-semibold',
        active ? 'border-moss bg-moss text-white' : 'border-grey-300 bg-white text-bark hover:border-moss',
      )}
    >
      {children}
    </button>
  );
}

/**
 * Log a chore in the barn: tap the chore, tap the minutes (15 is chosen already), send. The date is the
 * farm's today; the animal, litter or group, a weight, a count and photos are there for when they matter.
 */
export function LogChoreForm({ kinds, today, choices, onLogged }: { kinds: ChoreKind[]; today: string; choices: ChoreChoices; onLogged?: () => void }) {
  const log = useLogChore();
  const unit = useWeightUnit();
  const [photos, setPhotos] = useState<File[]>([]);
  const form = useForm<Values, unknown, ChoreEntryInput>({
    resolver: sharedSchemaResolver<Values, ChoreEntryInput>(choreEntrySchema, (v) => {
      const [targetKind, targetId] = v.target ? v.target.split(':') : [];
      return {
        kind: v.kind,
        minutes: whole(v.minutes),
        doneOn: v.doneOn || undefined,
        animalId: targetKind === 'animal' ? targetId : undefined,
        litterId: targetKind === 'litter' ? targetId : undefined,
        groupId: targetKind === 'group' ? targetId : undefined,
        notes: v.notes,
        weighing: v.major.trim() || v.minor.trim() ? { totalGrams: weightInputToGrams(v.major, v.minor, unit) ?? NaN, headCount: whole(v.heads) ?? 1 } : undefined,
        litterCount: v.litterKind ? { kind: v.litterKind, count: whole(v.litterCount), cause: v.cause || undefined } : undefined,
        palpation: v.kind === 'palpation' && v.palpation ? { result: v.palpation } : undefined,
      } as ChoreEntryInput;
    }, (path) => {
      if (path.startsWith('weighing')) return 'major';
      if (path.startsWith('litterCount')) return 'litterCount';
      if (path.startsWith('palpation')) return 'palpation';
      if (path === 'animalId' || path === 'litterId' || path === 'groupId') return 'target';
      return (['kind', 'minutes', 'doneOn', 'notes'] as const).find((f) => f === path) ?? null;
    }),
    defaultValues: { kind: '', minutes: '15', doneOn: today, target: '', notes: '', major: '', minor: '', heads: '1', litterKind: '', litterCount: '', cause: '', palpation: '' },
  });
  // The photos travel beside the body: the entry is created first, then they are uploaded to it.
  const withPhotos = { mutate: (body: ChoreEntryInput, opts?: Parameters<typeof log.mutate>[1]) => log.mutate({ ...body, photos }, opts), reset: log.reset, error: log.error };
  const { submit, failure } = useServerSubmit(
    form,
    withPhotos,
    {
      fields: ['kind', 'minutes', 'doneOn', 'target', 'notes', 'major', 'litterCount', 'palpation'],
      onSuccess: () => {
        form.reset({ ...form.getValues(), kind: '', notes: '', major: '', minor: '', litterKind: '', litterCount: '', cause: '', target: '', palpation: '' });
        setPhotos([]);
        onLogged?.();
      },
    },
  );
  const kind = form.watch('kind');
  const minutes = form.watch('minutes');
  const target = form.watch('target');
  const litterKind = form.watch('litterKind');
  const weighs = kind === 'weighing';
  const palpates = kind === 'palpation';
  const palpation = form.watch('palpation');
  const counts = kind === 'weaning' || kind === 'nest-box-check' || litterKind !== '';
  const dangerous = kind === 'processing-station';
  const targetOptions = [
    { value: '', label: 'None' },
    ...choices.groups.map((g) => ({ value: `group:${g.id}`, label: `Group: ${g.label}` })),
    ...choices.animals.map((a) => ({ value: `animal:${a.id}`, label: `Animal: ${a.label}` })),
    ...choices.litters.map((l) => ({ value: `litter:${l.id}`, label: l.label })),
  ];
  const errors = form.formState.errors;

  return (
    <form onSubmit={submit} noValidate className="space-y-6" aria-label="Log a chore">
      <fieldset className="space-y-2">
        <legend className="text-lg font-bold text-bark">What did you do?</legend>
        <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-4">
          {kinds.map((k) => (
            <Chip key={k.key} active={kind === k.key} onClick={() => form.setValue('kind', k.key, { shouldValidate: form.formState.isSubmitted })}>
              {k.label}
            </Chip>
          ))}
        </div>
        {errors.kind && <p className="font-semibold text-clay-deep" role="alert">Choose the chore</p>}
      </fieldset>

      <fieldset className="space-y-2">
        <legend className="text-lg font-bold text-bark">How long?</legend>
        <div className="flex flex-wrap gap-2">
          {quickMinutes.map((m) => (
            <Chip key={m} active={minutes === m} onClick={() => form.setValue('minutes', m)}>{`${m} min`}</Chip>
          ))}
        </div>
        <TextField label="Minutes" inputMode="numeric" className="max-w-40" error={errors.minutes?.message} {...form.register('minutes')} />
      </fieldset>

      {dangerous && <Alert tone="warning" title="Processing stations">{dangerousSkillCaution}</Alert>}

      <details className="space-y-4 rounded-xl border border-grey-200 p-4" open={weighs || counts || palpates || Boolean(target)}>
        <summary className="min-h-11 cursor-pointer py-2 font-semibold text-moss-deep">Animal, litter or group, weight, notes, photos</summary>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField label="About" options={targetOptions} error={errors.target?.message} {...form.register('target')} />
          <TextField label="Date" type="date" max={today} error={errors.doneOn?.message} {...form.register('doneOn')} />
          {(weighs || form.watch('major') || form.watch('minor')) && (
            <>
              <WeightInput
                label="Weight on the scale"
                unit={unit}
                error={errors.major?.message}
                hint="The group's total for a group"
                majorProps={form.register('major')}
                minorProps={form.register('minor')}
              />
              {target.startsWith('group:') && <TextField label="Head count" inputMode="numeric" {...form.register('heads')} />}
            </>
          )}
          {counts && target.startsWith('litter:') && (
            <>
              <SelectField
                label="Kits"
                options={[{ value: '', label: 'No change' }, { value: 'lost', label: 'Lost' }, { value: 'culled', label: 'Culled' }, { value: 'weaned', label: 'Weaned' }]}
                {...form.register('litterKind')}
              />
              {litterKind && <TextField label="How many kits" inputMode="numeric" error={errors.litterCount?.message} {...form.register('litterCount')} />}
              {litterKind === 'lost' && <TextField label="Cause" {...form.register('cause')} />}
            </>
          )}
        </div>
        {palpates && (
          <fieldset className="space-y-2">
            <legend className="font-semibold text-bark">What did you feel?</legend>
            <p className="text-grey-700">Choose the doe above (one of your mentor&apos;s with an open service). It counts once your mentor accepts it.</p>
            <div className="flex flex-wrap gap-2">
              {palpationChoices.map((c) => (
                <Chip key={c.value} active={palpation === c.value} onClick={() => form.setValue('palpation', palpation === c.value ? '' : c.value)}>
                  {c.label}
                </Chip>
              ))}
            </div>
            {errors.palpation && <p className="font-semibold text-clay-deep" role="alert">{errors.palpation.message}</p>}
          </fieldset>
        )}
        <TextAreaField label="Notes" rows={3} error={errors.notes?.message} {...form.register('notes')} />
        <label className="block space-y-1">
          <span className="font-semibold text-bark">Photos</span>
          <input
            type="file"
            accept="image/jpeg,image/png,image/webp"
            multiple
            className="block min-h-11 w-full text-base"
            onChange={(e) => setPhotos([...(e.target.files ?? [])])}
          />
        </label>
      </details>

      {log.isSuccess && <Alert tone="success">Sent to your mentor for review.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={log.isPending} className="w-full sm:w-auto">Send for review</Button>
    </form>
  );
}
