import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorCode, type BreedingStockDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { useBreedingStock } from '../api/get-breeding-stock';
import { useRecordService } from '../api/record-service';
import { formatDate } from '../../../lib/days';
import { fieldErrors } from '../../../lib/form-errors';
import { animalName } from '../../../lib/names';

function doeLabel(d: BreedingStockDto): string {
  const notes = [d.openService ? `open service from ${formatDate(d.openService.servicedOn)}` : null, d.underTreatment ? 'under treatment' : null].filter(Boolean);
  return `${animalName(d)}${notes.length ? ` — ${notes.join(', ')}` : ''}`;
}

/** Records a service; warnings (a young doe, one under treatment) are shown and must be confirmed. */
export function ServiceForm({ initialDoeId }: { initialDoeId?: string }) {
  const { data: stock } = useBreedingStock();
  const record = useRecordService();
  const navigate = useNavigate();
  const [doeId, setDoeId] = useState(initialDoeId ?? '');
  const [buckId, setBuckId] = useState(stock.bucks.length === 1 ? stock.bucks[0]!.id : '');
  const [servicedOn, setServicedOn] = useState(stock.today);
  const [notes, setNotes] = useState('');
  const errors = fieldErrors(record.error);
  const needsConfirm = isApiError(record.error, ErrorCode.confirmationRequired);
  const send = (confirm: boolean) =>
    record.mutate(
      { doeId, buckId, servicedOn, notes, ...(confirm ? { confirm: true } : {}) },
      { onSuccess: (service) => navigate(`/almanac/services/${service.id}`, { state: { recorded: true } }) },
    );
  const doe = stock.does.find((d) => d.id === doeId);

  return (
    <form
      noValidate
      className="space-y-5"
      onSubmit={(e) => {
        e.preventDefault();
        send(false);
      }}
    >
      <div className="grid gap-5 md:grid-cols-2">
        <SelectField
          label="Doe"
          value={doeId}
          onChange={(e) => setDoeId(e.target.value)}
          error={needsConfirm ? undefined : errors.doeId}
          options={[{ value: '', label: 'Choose a doe' }, ...stock.does.map((d) => ({ value: d.id, label: doeLabel(d) }))]}
        />
        <SelectField
          label="Buck"
          hint="Your own bucks, and any kept here on loan."
          value={buckId}
          onChange={(e) => setBuckId(e.target.value)}
          error={needsConfirm ? undefined : errors.buckId}
          options={[
            { value: '', label: 'Choose a buck' },
            ...stock.bucks.map((b) => ({ value: b.id, label: `${animalName(b)}${b.onLoanFrom ? ` — on loan from ${b.onLoanFrom.name}` : ''}` })),
          ]}
        />
        <TextField label="Date of the service" type="date" max={stock.today} value={servicedOn} onChange={(e) => setServicedOn(e.target.value)} error={errors.servicedOn} />
        <TextAreaField label="Notes (optional)" rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} error={errors.notes} />
      </div>
      {doe?.underTreatment && (
        <Alert tone="warning" title="She is under treatment">
          {doe.underTreatment.treatment} until {formatDate(doe.underTreatment.endsOn)}. No drugs are approved for rabbits in the US: ask the veterinarian who
          prescribed it before breeding her.
        </Alert>
      )}
      {needsConfirm && record.error && (
        <Alert
          tone="warning"
          title="Check before saving"
          actions={
            <Button onClick={() => send(true)} isBusy={record.isPending}>
              Save anyway
            </Button>
          }
        >
          <ul className="list-disc space-y-1 pl-5">
            {Object.values(fieldErrors(record.error)).map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </Alert>
      )}
      {record.isError && !needsConfirm && Object.keys(errors).length === 0 && (
        <Alert tone="error" title="Service not saved">
          {record.error.message}
        </Alert>
      )}
      <Button type="submit" isBusy={record.isPending && !needsConfirm}>
        Save the service
      </Button>
    </form>
  );
}
