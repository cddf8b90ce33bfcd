import { useState } from 'react';
import { ErrorCode, formatWeight, outsidePublishedRange, type CycleSettings, type CycleSettingsDto, type CycleSettingSource } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { useUpdateCycleSettings } from '../api/update-cycle-settings';
import { fieldErrors } from '../../../lib/form-errors';

type NumberKey = Exclude<keyof CycleSettings, 'weighInAgesDays'>;

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
  const [values, setValues] = useState<Record<string, string>>(() => ({
    ...Object.fromEntries(fields.map((f) => [f.key, String(current.settings[f.key])])),
    weighInAgesDays: current.settings.weighInAgesDays.join(', '),
  }));
  const errors = fieldErrors(save.error);
  const submit = () => {
    const patch: Record<string, unknown> = { version: current.version };
    for (const f of fields) if (Number(values[f.key]) !== current.settings[f.key]) patch[f.key] = Number(values[f.key]);
    const ages = (values.weighInAgesDays ?? '').split(/[,\s]+/).filter(Boolean).map(Number);
    if (ages.join(',') !== current.settings.weighInAgesDays.join(',')) patch.weighInAgesDays = ages;
    save.mutate(patch as Parameters<typeof save.mutate>[0]);
  };
  return (
    <form
      noValidate
      className="space-y-5"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
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
          const value = Number(values[f.key]);
          const range = Number.isFinite(value) ? outsidePublishedRange(f.key, value) : null;
          return (
            <TextField
              key={f.key}
              label={`${f.label} (${f.unit})`}
              type="number"
              inputMode="numeric"
              disabled={!canEdit}
              value={values[f.key]}
              onChange={(e) => setValues({ ...values, [f.key]: e.target.value })}
              error={errors[f.key]}
              hint={
                <>
                  Published: {source.publishedText}. Source: {sourceText(source)}
                  {f.key === 'targetLiveWeightGrams' && Number.isFinite(value) ? ` ${formatWeight(value, 'lb_oz')} (${formatWeight(value, 'kg_g')}).` : ''}
                  {range === 'below' || range === 'above' ? <strong className="block text-clay-deep">Outside the published range: fine if you know your herd.</strong> : null}
                </>
              }
            />
          );
        })}
        <TextField
          label="Weigh-in ages (days, youngest first)"
          disabled={!canEdit}
          value={values.weighInAgesDays}
          onChange={(e) => setValues({ ...values, weighInAgesDays: e.target.value })}
          error={errors.weighInAgesDays}
          hint={`Source: ${sourceText(current.sources.weighInAgesDays)}`}
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
