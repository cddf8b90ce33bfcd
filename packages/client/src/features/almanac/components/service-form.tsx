import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { serviceCreateSchema, type BreedingStockDto, type ServiceCreateBody } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { TextLink } from '../../../components/ui/text-link';
import { animalName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useBreedingStock } from '../api/get-breeding-stock';
import { useRecordService } from '../api/record-service';
import { Badge } from '../../../components/ui/badge';
import { coiLevel, formatCoi, useTrialMatings } from '../../herd';

function doeLabel(d: BreedingStockDto): string {
  const notes = [d.openService ? `served on ${formatDate(d.openService.servicedOn)}` : null, d.underTreatment ? 'under treatment' : null].filter(Boolean);
  return `${animalName(d)}${notes.length ? ` — ${notes.join(', ')}` : ''}`;
}

interface ServiceValues {
  doeId: string;
  buckId: string;
  servicedOn: string;
  notes: string;
}

const resolver = sharedSchemaResolver<ServiceValues, ServiceCreateBody>(serviceCreateSchema, (v) => v);

/** Records a service; warnings (a young doe, one under treatment) are shown and must be confirmed. */
export function ServiceForm({ initialDoeId, initialBuckId }: { initialDoeId?: string; initialBuckId?: string }) {
  const { data: stock } = useBreedingStock();
  const record = useRecordService();
  const navigate = useNavigate();
  const form = useForm<ServiceValues, unknown, ServiceCreateBody>({
    resolver,
    defaultValues: { doeId: initialDoeId ?? '', buckId: initialBuckId && stock.bucks.some((b) => b.id === initialBuckId) ? initialBuckId : stock.bucks.length === 1 ? stock.bucks[0]!.id : '', servicedOn: stock.today, notes: '' },
  });
  const { errors } = form.formState;
  const { submit, confirm, warnings, failure } = useServerSubmit(form, record, {
    onSuccess: (service) => navigate(`/almanac/services/${service.id}`, { state: { recorded: true } }),
  });
  const doe = stock.does.find((d) => d.id === form.watch('doeId'));

  return (
    <form noValidate className="space-y-5" onSubmit={submit}>
      <div className="grid gap-5 md:grid-cols-2">
        <SelectField
          label="Doe"
          error={errors.doeId?.message}
          options={[{ value: '', label: 'Choose a doe' }, ...stock.does.map((d) => ({ value: d.id, label: doeLabel(d) }))]}
          {...form.register('doeId')}
        />
        <SelectField
          label="Buck"
          hint="Your own bucks, and any kept here on loan."
          error={errors.buckId?.message}
          options={[
            { value: '', label: 'Choose a buck' },
            ...stock.bucks.map((b) => ({ value: b.id, label: `${animalName(b)}${b.onLoanFrom ? ` — on loan from ${b.onLoanFrom.name}` : ''}` })),
          ]}
          {...form.register('buckId')}
        />
        <TextField label="Date of the service" type="date" max={stock.today} error={errors.servicedOn?.message} {...form.register('servicedOn')} />
        <TextAreaField label="Notes (optional)" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      </div>
      <Kinship doeId={form.watch('doeId')} buckId={form.watch('buckId')} />
      {doe && (
        <p className="text-grey-700">
          No buck here suits her?{' '}
          <TextLink to={`/stud-share/find/${doe.id}`}>Find a stud buck across the co-op for {doe.name || doe.tattoo}</TextLink>
        </p>
      )}
      {doe?.underTreatment && (
        <Alert tone="warning" title="She is under treatment">
          {doe.underTreatment.treatment} until {formatDate(doe.underTreatment.endsOn)}. No drugs are approved for rabbits in the US: ask the veterinarian who
          prescribed it before breeding her.
        </Alert>
      )}
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={record.isPending} />
      {failure && (
        <Alert tone="error" title="Service not saved">
          {failure}
        </Alert>
      )}
      <Button type="submit" isBusy={record.isPending && !warnings}>
        Save the service
      </Button>
    </form>
  );
}

/** Before saving: how related the pair is, as the litter's COI and in words. */
function Kinship({ doeId, buckId }: { doeId: string; buckId: string }) {
  const trial = useTrialMatings(doeId, doeId && buckId ? [buckId] : []);
  const litter = trial.data?.litters[0];
  if (!doeId || !buckId) return null;
  if (!litter) return <p className="text-grey-600" aria-live="polite">Working out their kinship…</p>;
  const level = coiLevel(litter.coi);
  const words = litter.relationship === 'no shared ancestor on record' ? 'No shared ancestor on record.' : `He is ${litter.relationship.startsWith('her ') ? litter.relationship : `her ${litter.relationship}`}.`;
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2 rounded-xl border border-grey-200 bg-oat/50 p-3" aria-live="polite" data-testid="service-kinship">
      <p>
        <span className="text-grey-600">Litter's COI </span>
        <strong className="text-xl">{formatCoi(litter.coi)}</strong>
      </p>
      <Badge tone={level.tone}>{level.label}</Badge>
      <p className="font-medium">{words}</p>
    </div>
  );
}
