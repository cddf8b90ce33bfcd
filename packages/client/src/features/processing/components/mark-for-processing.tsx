import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { errorText } from '../../../lib/form-errors';
import { useMarkForProcessing } from '../api/processing-mutations';

/**
 * "Mark for processing" for one animal or grow-out group (the group and animal screens include it).
 * Refused with the reason while a veterinarian's withdrawal covers today or the planned day.
 */
export function MarkForProcessing({ animalId, groupId, today }: { animalId?: string; groupId?: string; today: string }) {
  const mark = useMarkForProcessing();
  const [plannedOn, setPlannedOn] = useState(today);
  return (
    <form
      noValidate
      aria-label="Mark for processing"
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        mark.mutate({ animalId, groupId, plannedOn });
      }}
    >
      <TextField label="Planned processing day" type="date" min={today} value={plannedOn} onChange={(e) => setPlannedOn(e.target.value)} />
      <Button type="submit" variant="secondary" isBusy={mark.isPending}>
        Mark for processing
      </Button>
      {mark.isSuccess && <p role="status" className="w-full text-sm font-medium text-moss-deep">Marked for processing on {mark.data.plannedOn}.</p>}
      {mark.isError && <p role="alert" className="w-full text-sm font-medium text-clay-deep">{errorText(mark.error)}</p>}
    </form>
  );
}
