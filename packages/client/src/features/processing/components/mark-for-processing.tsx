import { useForm } from 'react-hook-form';
import { processingMarkCreateSchema, type ProcessingMarkCreateBody } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { formatDate } from '../../../lib/days';
import { useMarkForProcessing } from '../api/processing-mutations';

/**
 * "Mark for processing" for one animal or grow-out group (the group and animal screens include it).
 * Refused with the reason while a veterinarian's withdrawal covers today or the planned day.
 */
export function MarkForProcessing({ animalId, groupId, today }: { animalId?: string; groupId?: string; today: string }) {
  const mark = useMarkForProcessing();
  const form = useForm<{ plannedOn: string }, unknown, ProcessingMarkCreateBody>({
    resolver: sharedSchemaResolver(processingMarkCreateSchema, ({ plannedOn }) => ({ animalId, groupId, plannedOn })),
    defaultValues: { plannedOn: today },
  });
  const { submit, failure } = useServerSubmit(form, mark);
  return (
    <form noValidate aria-label="Mark for processing" className="flex flex-wrap items-end gap-3" onSubmit={submit}>
      <TextField label="Planned processing day" type="date" min={today} error={form.formState.errors.plannedOn?.message} {...form.register('plannedOn')} />
      <Button type="submit" variant="secondary" isBusy={mark.isPending}>
        Mark for processing
      </Button>
      {mark.isSuccess && <p role="status" className="w-full text-sm font-medium text-moss-deep">Marked for processing on {formatDate(mark.data.plannedOn)}.</p>}
      {failure && <p role="alert" className="w-full text-sm font-medium text-clay-deep">{failure}</p>}
    </form>
  );
}
