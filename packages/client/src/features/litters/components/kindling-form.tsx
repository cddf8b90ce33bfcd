import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorCode } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { fieldErrors } from '../../../lib/form-errors';
import { useRecordKindling } from '../api/record-kindling';

/** The kindling of a service: the date, born alive and born dead; the litter's plan follows from the real date. */
export function KindlingForm({ serviceId, today }: { serviceId: string; today: string }) {
  const record = useRecordKindling();
  const navigate = useNavigate();
  const [kindledOn, setKindledOn] = useState(today);
  const [bornAlive, setBornAlive] = useState('');
  const [bornDead, setBornDead] = useState('0');
  const errors = fieldErrors(record.error);
  const needsConfirm = isApiError(record.error, ErrorCode.confirmationRequired);
  const send = (confirm: boolean) =>
    record.mutate(
      { serviceId, kindledOn, bornAlive: Number(bornAlive === '' ? NaN : bornAlive), bornDead: Number(bornDead === '' ? NaN : bornDead), ...(confirm ? { confirm: true } : {}) },
      { onSuccess: (litter) => navigate(`/litters/${litter.id}`, { state: { kindled: true } }) },
    );
  return (
    <form
      noValidate
      aria-label="Record the kindling"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        send(false);
      }}
    >
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField label="Kindled on" type="date" max={today} value={kindledOn} onChange={(e) => setKindledOn(e.target.value)} error={needsConfirm ? undefined : errors.kindledOn} />
        <TextField label="Born alive" type="number" inputMode="numeric" min={0} value={bornAlive} onChange={(e) => setBornAlive(e.target.value)} error={errors.bornAlive} />
        <TextField label="Born dead" type="number" inputMode="numeric" min={0} value={bornDead} onChange={(e) => setBornDead(e.target.value)} error={errors.bornDead} />
      </div>
      {needsConfirm && (
        <Alert tone="warning" title="Check before saving" actions={<Button onClick={() => send(true)}>Save anyway</Button>}>
          {errors.kindledOn}
        </Alert>
      )}
      {record.isError && !needsConfirm && Object.keys(errors).length === 0 && <Alert tone="error">{record.error.message}</Alert>}
      <Button type="submit" isBusy={record.isPending}>
        Save the kindling
      </Button>
    </form>
  );
}
