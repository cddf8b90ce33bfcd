import { useState } from 'react';
import { dressOut, usdaClass, weightInputToGrams, type WeightUnit } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { SelectField, type SelectOption } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { WeightInput } from '../../../components/ui/weight-input';
import { useRecordProcessing } from '../api/processing-mutations';
import { percent, usdaClassLabels } from '../processing-format';

interface ProcessingFormProps {
  today: string;
  unit: WeightUnit;
  animals: SelectOption[];
  groups: SelectOption[];
  birthDates: Map<string, string | null>;
}

type Weight = { major: string; minor: string };
const blank: Weight = { major: '', minor: '' };

/**
 * Records one animal from the Herd or a batch of a grow-out group's heads, in the farm's units. The
 * dress-out and class shown while typing are the ones the server computes and keeps (shared code).
 */
export function ProcessingForm({ today, unit, animals, groups, birthDates }: ProcessingFormProps) {
  const record = useRecordProcessing();
  const [kind, setKind] = useState<'animal' | 'group'>('group');
  const [subjectId, setSubjectId] = useState('');
  const [processedOn, setProcessedOn] = useState(today);
  const [heads, setHeads] = useState('1');
  const [live, setLive] = useState<Weight>(blank);
  const [hot, setHot] = useState<Weight>(blank);
  const [chilled, setChilled] = useState<Weight>(blank);
  const [notes, setNotes] = useState('');
  const [saved, setSaved] = useState<string | null>(null);
  const errors = fieldErrors(record.error);

  const grams = (w: Weight) => weightInputToGrams(w.major, w.minor, unit);
  const liveGrams = grams(live);
  const hotGrams = grams(hot);
  const chilledGrams = grams(chilled);
  const headCount = kind === 'animal' ? 1 : Math.max(1, Number.parseInt(heads, 10) || 1);
  const preview = liveGrams && hotGrams ? dressOut({ liveGrams, hotCarcassGrams: hotGrams, chilledCarcassGrams: chilledGrams }) : null;
  const classed = preview && !preview.invalid && hotGrams
    ? usdaClass({ birthDate: birthDates.get(subjectId) ?? null, processedOn, carcassGrams: (chilledGrams ?? hotGrams) / headCount })
    : null;

  return (
    <form
      noValidate
      aria-label="Record processing"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        setSaved(null);
        record.mutate(
          {
            ...(kind === 'animal' ? { animalId: subjectId || undefined } : { groupId: subjectId || undefined, headCount }),
            processedOn,
            liveGrams: liveGrams ?? Number.NaN,
            hotCarcassGrams: hotGrams ?? Number.NaN,
            chilledCarcassGrams: chilledGrams,
            notes,
          },
          {
            onSuccess: (r) => {
              setSaved(`Saved: dress-out ${percent(r.hotDressOutPercent)}, ${usdaClassLabels[r.usdaClass]}.`);
              setLive(blank);
              setHot(blank);
              setChilled(blank);
              setSubjectId('');
            },
          },
        );
      }}
    >
      <fieldset>
        <legend className="font-medium">Processed</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['group', 'animal'] as const).map((k) => (
            <label key={k} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" name="processed-kind" className="size-6 accent-moss" checked={kind === k} onChange={() => { setKind(k); setSubjectId(''); }} />
              <span className="font-medium">{k === 'group' ? 'A batch from a grow-out group' : 'One animal from the Herd'}</span>
            </label>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField
          label={kind === 'group' ? 'Grow-out group' : 'Animal'}
          value={subjectId}
          onChange={(e) => setSubjectId(e.target.value)}
          error={kind === 'group' ? (errors.groupId ?? errors.animalId) : errors.animalId}
          options={[{ value: '', label: kind === 'group' ? 'Choose a group' : 'Choose an animal' }, ...(kind === 'group' ? groups : animals)]}
        />
        <TextField label="Processed on" type="date" max={today} value={processedOn} onChange={(e) => setProcessedOn(e.target.value)} error={errors.processedOn} />
        {kind === 'group' && (
          <TextField label="Heads processed" type="number" inputMode="numeric" min={1} value={heads} onChange={(e) => setHeads(e.target.value)} error={errors.headCount} />
        )}
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <WeightInput label={kind === 'group' ? 'Live weight, all heads' : 'Live weight'} unit={unit} {...fields(live, setLive)} error={errors.liveGrams} />
        <WeightInput label="Hot carcass" unit={unit} {...fields(hot, setHot)} error={errors.hotCarcassGrams} />
        <WeightInput label="Chilled carcass (optional)" unit={unit} {...fields(chilled, setChilled)} error={errors.chilledCarcassGrams} />
      </div>
      {preview && (
        <div aria-live="polite" className="rounded-xl bg-oat/70 p-4">
          <p>
            Dress-out <strong>{percent(preview.hotPercent)}</strong>
            {preview.chilledPercent !== null && <> · chilled <strong>{percent(preview.chilledPercent)}</strong></>}
            {classed && <> · {usdaClassLabels[classed.usdaClass]}</>}
          </p>
          {classed && <p className="text-sm text-grey-600">{classed.reason}{classed.note ? `. ${classed.note}` : ''}</p>}
          {preview.flags.map((f) => (
            <p key={f.code + f.field} className={f.level === 'error' ? 'text-sm font-medium text-clay-deep' : 'text-sm text-bark'}>
              {f.message}
            </p>
          ))}
        </div>
      )}
      <TextField label="Notes (optional)" value={notes} onChange={(e) => setNotes(e.target.value)} error={errors.notes} />
      {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
      {saved && <p role="status" className="text-sm font-medium text-moss-deep">{saved}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the processing record
      </Button>
    </form>
  );
}

function fields(value: Weight, set: (w: Weight) => void) {
  return { major: value.major, minor: value.minor, onMajor: (major: string) => set({ ...value, major }), onMinor: (minor: string) => set({ ...value, minor }) };
}
