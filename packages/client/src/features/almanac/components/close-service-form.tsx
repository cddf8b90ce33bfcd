import { useForm } from 'react-hook-form';
import { serviceClosureSchema, type ServiceClosureInput, type ServiceDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useCloseService } from '../api/close-service';

interface ClosureValues {
  closedOn: string;
  reason: string;
}

/** She did not kindle: close the service, skip its open tasks, plan the rebreed. */
export function CloseServiceForm({ service, today }: { service: ServiceDto; today: string }) {
  const close = useCloseService(service.id);
  const form = useForm<ClosureValues, unknown, ServiceClosureInput>({
    // The version is the one this screen showed, so a close after someone else's change is refused.
    resolver: sharedSchemaResolver(serviceClosureSchema, (v) => ({ ...v, version: service.version })),
    defaultValues: { closedOn: today, reason: 'No kits by the end of the window' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, close);
  return (
    <form noValidate aria-label="Close the service as missed" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Closed on" type="date" max={today} error={errors.closedOn?.message} {...form.register('closedOn')} />
        <TextField label="Why" error={errors.reason?.message} {...form.register('reason')} />
      </div>
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" variant="danger" isBusy={close.isPending}>
        Close as missed
      </Button>
    </form>
  );
}
