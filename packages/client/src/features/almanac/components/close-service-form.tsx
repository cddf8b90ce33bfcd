import { useState } from 'react';
import type { ServiceDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { useCloseService } from '../api/close-service';
import { errorText, fieldErrors } from '../../../lib/form-errors';

/** She did not kindle: close the service, skip its open tasks, plan the rebreed. */
export function CloseServiceForm({ service, today }: { service: ServiceDto; today: string }) {
  const close = useCloseService(service.id);
  const [closedOn, setClosedOn] = useState(today);
  const [reason, setReason] = useState('No kits by the end of the window');
  const errors = fieldErrors(close.error);
  return (
    <form
      noValidate
      aria-label="Close the service as missed"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        close.mutate({ closedOn, reason, version: service.version });
      }}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Closed on" type="date" max={today} value={closedOn} onChange={(e) => setClosedOn(e.target.value)} error={errors.closedOn} />
        <TextField label="Why" value={reason} onChange={(e) => setReason(e.target.value)} error={errors.reason} />
      </div>
      {close.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(close.error)}</p>}
      <Button type="submit" variant="danger" isBusy={close.isPending}>
        Close as missed
      </Button>
    </form>
  );
}
