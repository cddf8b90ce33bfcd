import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { coopRulesUpdateSchema, ErrorCode, type CoopRulesUpdateInput, type CoopSettingsDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { isApiError } from '../../../lib/api-client';
import { formatInstant } from '../../../lib/dates';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { coopSettingsQueryOptions } from '../api/get-coop-settings';
import { useUpdateCoopRules } from '../api/update-coop-rules';

/** The co-op's own rules, which every applicant reads and agrees to on the application form. */
export function RulesEditor({ settings }: { settings: CoopSettingsDto }) {
  const queryClient = useQueryClient();
  const update = useUpdateCoopRules();
  const form = useForm<CoopRulesUpdateInput>({
    resolver: zodResolver(coopRulesUpdateSchema),
    values: { rulesText: settings.rulesText, version: settings.version },
    resetOptions: { keepDirtyValues: true },
  });
  const { errors, isDirty } = form.formState;
  const stale = isApiError(update.error, ErrorCode.staleVersion);

  const submit = form.handleSubmit((values) =>
    update.mutate(values, {
      onSuccess: (saved) => form.reset({ rulesText: saved.rulesText, version: saved.version }),
      onError: (error) => {
        if (applyServerFieldErrors(error, form.setError, ['rulesText'])) update.reset();
      },
    }),
  );

  const reload = async () => {
    const fresh = await queryClient.fetchQuery({ ...coopSettingsQueryOptions(), staleTime: 0 });
    form.reset({ rulesText: fresh.rulesText, version: fresh.version });
    update.reset();
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {stale ? (
        <Alert
          tone="warning"
          title="Another admin saved the rules first"
          actions={
            <Button variant="secondary" onClick={() => void reload()}>
              Load their version
            </Button>
          }
        >
          Your text was not saved, so nothing of theirs was overwritten. Loading their version replaces what you typed;
          copy anything you want to keep first.
        </Alert>
      ) : (
        update.isError && <Alert tone="error" title="Rules not saved">{update.error.message}</Alert>
      )}
      {update.isSuccess && !isDirty && <Alert tone="success">Rules saved. New applicants read and agree to this text.</Alert>}
      <TextAreaField
        label="Rules every member agrees to"
        hint="Plain text; leave an empty line between rules. Say how long new or returning stock is quarantined, what to report and to whom, and anything about selling meat (members must check their own state and local rules)."
        rows={14}
        error={errors.rulesText?.message}
        {...form.register('rulesText')}
      />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-grey-600">Last changed {formatInstant(settings.updatedAt)}. Applicants who already agreed keep the text they saw.</p>
        <Button type="submit" isBusy={update.isPending} disabled={!isDirty}>
          Save rules
        </Button>
      </div>
    </form>
  );
}
