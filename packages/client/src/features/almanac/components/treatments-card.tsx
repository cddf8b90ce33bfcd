import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { useBreedingStock } from '../api/get-breeding-stock';
import { useTreatments } from '../api/get-treatments';
import { useRecordTreatment } from '../api/record-treatment';
import { formatDate } from '../almanac-dates';
import { errorText, fieldErrors } from '../error-text';
import { animalName } from './open-services';

/** Treatments of the farm's breeding stock; a doe under one is flagged before she is bred. */
export function TreatmentsCard() {
  const { data: stock } = useBreedingStock();
  const treatments = useTreatments();
  const record = useRecordTreatment();
  const [animalId, setAnimalId] = useState('');
  const [startedOn, setStartedOn] = useState(stock.today);
  const [endsOn, setEndsOn] = useState(stock.today);
  const [treatment, setTreatment] = useState('');
  const [veterinarian, setVeterinarian] = useState('');
  const errors = fieldErrors(record.error);
  const current = (treatments.data?.treatments ?? []).filter((t) => t.endsOn >= stock.today);
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-bold">Treatments</h2>
      <Alert tone="warning">
        No drugs are approved for rabbits in the US: any treatment is extralabel and needs a veterinarian, who sets the withdrawal time before slaughter. Enter
        the last day of that withdrawal.
      </Alert>
      {current.length > 0 && (
        <ul className="space-y-1">
          {current.map((t) => (
            <li key={t.id}>
              <strong>{animalName(t.animal)}</strong>: {t.treatment}, {formatDate(t.startedOn)} to {formatDate(t.endsOn)}
              {t.veterinarian ? ` (${t.veterinarian})` : ''}
            </li>
          ))}
        </ul>
      )}
      <form
        noValidate
        aria-label="Record a treatment"
        className="space-y-4"
        onSubmit={(e) => {
          e.preventDefault();
          record.mutate({ animalId, startedOn, endsOn, treatment, veterinarian, notes: '' }, { onSuccess: () => setTreatment('') });
        }}
      >
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField
            label="Animal"
            value={animalId}
            onChange={(e) => setAnimalId(e.target.value)}
            error={errors.animalId}
            options={[{ value: '', label: 'Choose an animal' }, ...[...stock.does, ...stock.bucks].map((a) => ({ value: a.id, label: animalName(a) }))]}
          />
          <TextField label="Treatment" value={treatment} onChange={(e) => setTreatment(e.target.value)} error={errors.treatment} />
          <TextField label="Started on" type="date" max={stock.today} value={startedOn} onChange={(e) => setStartedOn(e.target.value)} error={errors.startedOn} />
          <TextField label="Withdrawal ends on" type="date" value={endsOn} onChange={(e) => setEndsOn(e.target.value)} error={errors.endsOn} />
          <TextField label="Veterinarian (optional)" value={veterinarian} onChange={(e) => setVeterinarian(e.target.value)} />
        </div>
        {record.isError && Object.keys(errors).length === 0 && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(record.error)}</p>}
        <Button type="submit" variant="secondary" isBusy={record.isPending}>
          Save the treatment
        </Button>
      </form>
    </Card>
  );
}
