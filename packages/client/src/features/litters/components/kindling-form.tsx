import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { kindlingCreateSchema, type KindlingCreateBody } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { TextField } from '../../../components/ui/text-field';
import { typedNumber } from '../../../lib/typed-number';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordKindling } from '../api/record-kindling';

interface KindlingValues {
  kindledOn: string;
  bornAlive: string;
  bornDead: string;
}

/** The kindling of a service: the date, born alive and born dead; the litter's plan follows from the real date. */
export function KindlingForm({ serviceId, today }: { serviceId: string; today: string }) {
  const record = useRecordKindling();
  const navigate = useNavigate();
  const form = useForm<KindlingValues, unknown, KindlingCreateBody>({
    resolver: sharedSchemaResolver(kindlingCreateSchema, (v) => ({ serviceId, kindledOn: v.kindledOn, bornAlive: typedNumber(v.bornAlive), bornDead: typedNumber(v.bornDead) })),
    defaultValues: { kindledOn: today, bornAlive: '', bornDead: '0' },
  });
  const { errors } = form.formState;
  const { submit, confirm, warnings, failure } = useServerSubmit(form, record, {
    onSuccess: (litter) => navigate(`/litters/${litter.id}`, { state: { kindled: true } }),
  });
  return (
    <form noValidate aria-label="Record the kindling" className="space-y-4" onSubmit={submit}>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label="Kindled on" type="date" max={today} error={errors.kindledOn?.message} {...form.register('kindledOn')} />
        <TextField label="Born alive" type="number" inputMode="numeric" min={0} error={errors.bornAlive?.message} {...form.register('bornAlive')} />
        <TextField label="Born dead" type="number" inputMode="numeric" min={0} error={errors.bornDead?.message} {...form.register('bornDead')} />
      </div>
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={record.isPending} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={record.isPending}>
        Save the kindling
      </Button>
    </form>
  );
}
