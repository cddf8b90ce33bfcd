import { useForm } from 'react-hook-form';
import { palpationCreateSchema, type PalpationCreateInput, type ServiceDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordPalpation } from '../api/record-palpation';

interface PalpationValues {
  palpatedOn: string;
  result: '' | 'positive' | 'negative';
  notes: string;
}

type PalpationBody = Partial<PalpationCreateInput>;

const resolver = sharedSchemaResolver<PalpationValues, PalpationBody>(palpationCreateSchema, ({ palpatedOn, result, notes }) => ({
  palpatedOn,
  ...(result ? { result } : {}),
  notes,
}));

/** Kits felt or not: a negative palpation closes the service and plans the rebreed. */
export function PalpationForm({ service, today }: { service: ServiceDto; today: string }) {
  const record = useRecordPalpation(service.id);
  const form = useForm<PalpationValues, unknown, PalpationBody>({ resolver, defaultValues: { palpatedOn: today, result: '', notes: '' } });
  const { errors } = form.formState;
  const { submit, confirm, warnings, failure } = useServerSubmit(form, record, { onSuccess: () => form.setValue('result', '') });
  return (
    <form noValidate aria-label="Record the palpation" className="space-y-4" onSubmit={submit}>
      <fieldset className="space-y-1.5">
        <legend className="font-medium">Did you feel kits?</legend>
        <div className="flex flex-wrap gap-x-6">
          {(['positive', 'negative'] as const).map((value) => (
            <label key={value} className="flex min-h-11 cursor-pointer items-center gap-3">
              <input type="radio" value={value} className="size-6 accent-moss" {...form.register('result')} />
              <span className="font-medium">{value === 'positive' ? 'Yes, positive' : 'No, empty'}</span>
            </label>
          ))}
        </div>
        {errors.result && <p className="text-sm font-medium text-clay-deep">{errors.result.message}</p>}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Palpated on" type="date" max={today} error={errors.palpatedOn?.message} {...form.register('palpatedOn')} />
        <TextField label="Notes (optional)" error={errors.notes?.message} {...form.register('notes')} />
      </div>
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={record.isPending} />
      {failure && <p role="alert" className="text-sm font-medium text-clay-deep">{failure}</p>}
      <Button type="submit" isBusy={record.isPending}>
        Save the palpation
      </Button>
    </form>
  );
}
