import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import {
  cycleSettingsSchema,
  ErrorCode,
  CYCLE_SETTING_LIMITS,
  formatWeight,
  gramsToWeightInput,
  outsidePublishedRange,
  weightInputToGrams,
  type CycleSettings,
  type CycleSettingsDto,
  type CycleSettingSource,
  type WeightUnit,
} from '@burrowline/shared';
import type { Path } from 'react-hook-form';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { WeightInput } from '../../../components/ui/weight-input';
import { isApiError } from '../../../lib/api-client';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useUpdateCycleSettings } from '../api/update-cycle-settings';

type NumberKey = Exclude<keyof CycleSettings, 'weighInAgesDays' | 'targetLiveWeightGrams'>;
/** Every setting as typed: numbers as text, the weigh-in ages as one line, the target weight in the farm's two units. */
type CycleSettingsValues = Record<NumberKey | 'weighInAgesDays' | 'targetMajor' | 'targetMinor', string>;

const unitWords: Record<WeightUnit, string> = { lb_oz: 'pounds and ounces', kg_g: 'kilograms and grams' };

/** The server's messages for the stored grams go under the weight the breeder typed. */
const fieldOf = (path: string): Path<CycleSettingsValues> | null => {
  const top = path.split('.')[0]!;
  if (top === 'targetLiveWeightGrams') return 'targetMajor';
  return top === 'weighInAgesDays' || fields.some((f) => f.key === top) ? (top as Path<CycleSettingsValues>) : null;
};

/** The source as a sentence, marking a fact of the trade with no published source as common practice. */
function sourceText(source: CycleSettingSource): string {
  const text = source.source.replace(/\.$/, '');
  const marked = source.confidence === 'common_practice' && !/common practice/i.test(text) ? `${text} (common practice)` : text;
  return `${marked}.`;
}

const fields: { key: NumberKey; label: string; unit: string }[] = [
  { key: 'palpationDays', label: 'Palpation', unit: 'days after service' },
  { key: 'nestBoxInDays', label: 'Nest box in', unit: 'days after service' },
  { key: 'kindlingExpectedDays', label: 'Kindling expected', unit: 'days after service' },
  { key: 'kindlingWindowStartDays', label: 'Kindling window opens', unit: 'days after service' },
  { key: 'kindlingWindowEndDays', label: 'Kindling window closes', unit: 'days after service' },
  { key: 'kindlingOverdueDays', label: 'Overdue alert', unit: 'days after service' },
  { key: 'nestBoxOutDays', label: 'Nest box out', unit: 'days after kindling' },
  { key: 'weaningDays', label: 'Weaning', unit: 'days after kindling' },
  { key: 'breedBackDays', label: 'Breeding back', unit: 'days after kindling' },
  { key: 'rebreedAfterNegativeDays', label: 'Rebreed', unit: 'days after an empty palpation' },
];

function valuesOf(current: CycleSettingsDto, unit: WeightUnit): CycleSettingsValues {
  const target = gramsToWeightInput(current.settings.targetLiveWeightGrams, unit);
  return {
    ...(Object.fromEntries(fields.map((f) => [f.key, String(current.settings[f.key])])) as Record<NumberKey, string>),
    weighInAgesDays: current.settings.weighInAgesDays.join(', '),
    targetMajor: target.major,
    targetMinor: target.minor,
  };
}

/** Where each default comes from: one disclosure under the settings, not a citation under every field. */
function SettingSources({ current }: { current: CycleSettingsDto }) {
  return (
    <details className="rounded-xl border border-grey-200 bg-oat/40 p-3">
      <summary className="min-h-11 cursor-pointer py-2 font-semibold text-moss-deep">Where do these numbers come from?</summary>
      <dl className="mt-2 space-y-2 text-sm">
        {fields.map((f) => (
          <div key={f.key}>
            <dt className="font-semibold">{f.label}</dt>
            <dd>Published: {current.sources[f.key].publishedText}. {sourceText(current.sources[f.key])}</dd>
          </div>
        ))}
        <div>
          <dt className="font-semibold">Target fryer live weight</dt>
          <dd>Published: {current.sources.targetLiveWeightGrams.publishedText}. {sourceText(current.sources.targetLiveWeightGrams)}</dd>
        </div>
        <div>
          <dt className="font-semibold">Weigh-in ages</dt>
          <dd>{sourceText(current.sources.weighInAgesDays)}</dd>
        </div>
      </dl>
    </details>
  );
}

/** The farm's cycle as it stands, for those who follow it but do not set it (an apprentice follows the mentor's farm). */
function CycleSettingsReadOnly({ current, unit }: { current: CycleSettingsDto; unit: WeightUnit }) {
  return (
    <div className="space-y-4">
      <p className="text-grey-700">Your mentor's farm sets these; ask your mentor if one looks wrong.</p>
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
        {fields.map((f) => (
          <div key={f.key} className="flex justify-between gap-3 border-b border-grey-100 py-1.5">
            <dt className="text-grey-700">{f.label}</dt>
            <dd className="text-right font-semibold">{current.settings[f.key]} {f.unit}</dd>
          </div>
        ))}
        <div className="flex justify-between gap-3 border-b border-grey-100 py-1.5">
          <dt className="text-grey-700">Target fryer live weight</dt>
          <dd className="font-semibold">{formatWeight(current.settings.targetLiveWeightGrams, unit)}</dd>
        </div>
        <div className="flex justify-between gap-3 border-b border-grey-100 py-1.5">
          <dt className="text-grey-700">Weigh-in ages</dt>
          <dd className="font-semibold">{current.settings.weighInAgesDays.join(', ')} days</dd>
        </div>
      </dl>
      <SettingSources current={current} />
    </div>
  );
}

/** The farm's own cycle; the published ranges and sources sit in one disclosure; saving re-plans open tasks only. */
export function CycleSettingsForm({ current, canEdit, unit }: { current: CycleSettingsDto; canEdit: boolean; unit: WeightUnit }) {
  if (!canEdit) return <CycleSettingsReadOnly current={current} unit={unit} />;
  return <CycleSettingsEditor current={current} unit={unit} />;
}

function CycleSettingsEditor({ current, unit }: { current: CycleSettingsDto; unit: WeightUnit }) {
  const save = useUpdateCycleSettings();
  const limits = CYCLE_SETTING_LIMITS.targetLiveWeightGrams;
  const form = useForm<CycleSettingsValues, unknown, CycleSettings>({
    // The whole set is checked, as the server checks the stored settings merged with the change.
    resolver: sharedSchemaResolver(
      cycleSettingsSchema,
      (v, refuse) => {
        // Typed in the farm's units, stored in whole grams; the limits are said in the same units.
        const grams = weightInputToGrams(v.targetMajor, v.targetMinor, unit);
        if (grams === null) refuse('targetMajor', `Target live weight: enter it in ${unitWords[unit]}`);
        else if (grams < limits.min || grams > limits.max) {
          refuse('targetMajor', `Target live weight: between ${formatWeight(limits.min, unit)} and ${formatWeight(limits.max, unit)}`);
        }
        return {
          ...(Object.fromEntries(fields.map((f) => [f.key, v[f.key] === '' ? NaN : Number(v[f.key])])) as Record<NumberKey, number>),
          weighInAgesDays: v.weighInAgesDays.split(/[,\s]+/).filter(Boolean).map(Number),
          targetLiveWeightGrams: grams ?? NaN,
        };
      },
      fieldOf,
    ),
    defaultValues: valuesOf(current, unit),
  });
  // A newer version (this save, or someone else's) becomes the starting point; the save's message stays.
  useEffect(() => form.reset(valuesOf(current, unit)), [current, unit, form]);
  const { errors } = form.formState;
  // Only what changed is sent, with the version this screen showed.
  const sendChanges = {
    mutate: (settings: CycleSettings, options?: Parameters<typeof save.mutate>[1]) => {
      const patch: Record<string, unknown> = { version: current.version };
      for (const f of fields) if (settings[f.key] !== current.settings[f.key]) patch[f.key] = settings[f.key];
      if (settings.targetLiveWeightGrams !== current.settings.targetLiveWeightGrams) patch.targetLiveWeightGrams = settings.targetLiveWeightGrams;
      if (settings.weighInAgesDays.join(',') !== current.settings.weighInAgesDays.join(',')) patch.weighInAgesDays = settings.weighInAgesDays;
      save.mutate(patch as Parameters<typeof save.mutate>[0], options);
    },
    reset: save.reset,
    error: save.error,
  };
  const { submit } = useServerSubmit(form, sendChanges, { fields: fieldOf });
  const [major, minor] = form.watch(['targetMajor', 'targetMinor']);
  const targetGrams = weightInputToGrams(major, minor, unit);
  const targetRange = targetGrams !== null ? outsidePublishedRange('targetLiveWeightGrams', targetGrams) : null;
  const targetSource = current.sources.targetLiveWeightGrams;
  return (
    <form noValidate className="space-y-5" onSubmit={submit}>
      {save.isSuccess && (
        <Alert tone="success">
          Saved. {save.data.replanned.changed} open {save.data.replanned.changed === 1 ? 'task was' : 'tasks were'} re-planned
          {save.data.replanned.added > 0 ? `, ${save.data.replanned.added} added` : ''}
          {save.data.replanned.skipped > 0 ? `, ${save.data.replanned.skipped} no longer planned` : ''}; done and moved tasks kept their dates.
        </Alert>
      )}
      {isApiError(save.error, ErrorCode.staleVersion) && <Alert tone="warning">Someone else changed the settings first. Reload the page to see theirs.</Alert>}
      <div className="grid gap-5 md:grid-cols-2">
        {fields.map((f) => {
          const value = Number(form.watch(f.key));
          const range = Number.isFinite(value) ? outsidePublishedRange(f.key, value) : null;
          return (
            <TextField
              key={f.key}
              label={`${f.label} (${f.unit})`}
              type="number"
              inputMode="numeric"
              error={errors[f.key]?.message}
              hint={range === 'below' || range === 'above' ? <strong className="text-clay-deep">Outside the published range: fine if you know your herd.</strong> : undefined}
              {...form.register(f.key)}
            />
          );
        })}
        <div className="space-y-1">
          <WeightInput
            label="Target fryer live weight"
            unit={unit}
            error={errors.targetMajor?.message}
            hint={unit === 'kg_g' && targetSource.published ? `Published: ${formatWeight(targetSource.published.min, unit)} to ${formatWeight(targetSource.published.max, unit)}` : undefined}
            majorProps={form.register('targetMajor')}
            minorProps={form.register('targetMinor')}
          />
          {(targetRange === 'below' || targetRange === 'above') && (
            <p className="text-sm font-bold text-clay-deep">Outside the published range: fine if you know your herd.</p>
          )}
        </div>
        <TextField
          label="Weigh-in ages (days, youngest first)"
          error={errors.weighInAgesDays?.message}
          {...form.register('weighInAgesDays')}
        />
      </div>
      <SettingSources current={current} />
      <Button type="submit" isBusy={save.isPending}>
        Save the cycle settings
      </Button>
    </form>
  );
}
