import { useForm } from 'react-hook-form';
import {
  cycleSettingsSchema,
  ErrorCode,
  formatWeight,
  outsidePublishedRange,
  type CycleSettings,
  type CycleSettingsDto,
  type CycleSettingSource,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useUpdateCycleSettings } from '../api/update-cycle-settings';

type NumberKey = Exclude<keyof CycleSettings, 'weighInAgesDays'>;
/** Every setting as typed: numbers as text, the weigh-in ages as one line. */
type CycleSettingsValues = Record<keyof CycleSettings, string>;

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
  { key: 'targetLiveWeightGrams', label: 'Target fryer live weight', unit: 'grams' },
];

/** The farm's own cycle, each default with its published range and source; saving re-plans open tasks only. */
export function CycleSettingsForm({ current, canEdit }: { current: CycleSettingsDto; canEdit: boolean }) {
  const save = useUpdateCycleSettings();
  const form = useForm<CycleSettingsValues, unknown, CycleSettings>({
    // The whole set is checked, as the server checks the stored settings merged with the change.
    resolver: sharedSchemaResolver(cycleSettingsSchema, (v) => ({
      ...(Object.fromEntries(fields.map((f) => [f.key, v[f.key] === '' ? NaN : Number(v[f.key])])) as Record<NumberKey, number>),
      weighInAgesDays: v.weighInAgesDays.split(/[,\s]+/).filter(Boolean).map(Number),
    })),
    defaultValues: {
      ...(Object.fromEntries(fields.map((f) => [f.key, String(current.settings[f.key])])) as Record<NumberKey, string>),
      weighInAgesDays: current.settings.weighInAgesDays.join(', '),
    },
  });
  const { errors } = form.formState;
  // Only what changed is sent, with the version this screen showed.
  const sendChanges = {
    mutate: (settings: CycleSettings, options?: Parameters<typeof save.mutate>[1]) => {
      const patch: Record<string, unknown> = { version: current.version };
      for (const f of fields) if (settings[f.key] !== current.settings[f.key]) patch[f.key] = settings[f.key];
      if (settings.weighInAgesDays.join(',') !== current.settings.weighInAgesDays.join(',')) patch.weighInAgesDays = settings.weighInAgesDays;
      save.mutate(patch as Parameters<typeof save.mutate>[0], options);
    },
    reset: save.reset,
    error: save.error,
  };
  const { submit } = useServerSubmit(form, sendChanges);
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
          const source = current.sources[f.key];
          const value = Number(form.watch(f.key));
          const range = Number.isFinite(value) ? outsidePublishedRange(f.key, value) : null;
          return (
            <TextField
              key={f.key}
              label={`${f.label} (${f.unit})`}
              type="number"
              inputMode="numeric"
              disabled={!canEdit}
              error={errors[f.key]?.message}
              hint={
                <>
                  Published: {source.publishedText}. Source: {sourceText(source)}
                  {f.key === 'targetLiveWeightGrams' && Number.isFinite(value) ? ` ${formatWeight(value, 'lb_oz')} (${formatWeight(value, 'kg_g')}).` : ''}
                  {range === 'below' || range === 'above' ? <strong className="block text-clay-deep">Outside the published range: fine if you know your herd.</strong> : null}
                </>
              }
              {...form.register(f.key)}
            />
          );
        })}
        <TextField
          label="Weigh-in ages (days, youngest first)"
          disabled={!canEdit}
          error={errors.weighInAgesDays?.message}
          hint={`Source: ${sourceText(current.sources.weighInAgesDays)}`}
          {...form.register('weighInAgesDays')}
        />
      </div>
      {canEdit && (
        <Button type="submit" isBusy={save.isPending}>
          Save the cycle settings
        </Button>
      )}
    </form>
  );
}
