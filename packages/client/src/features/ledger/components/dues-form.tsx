import { useForm } from 'react-hook-form';
import { duesSetSchema, type DuesSetInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useSetDues } from '../api/ledger-mutations';
import { centsFromText } from './money-input';

interface Values {
  year: string;
  amount: string;
  dueOn: string;
  reminderDaysBefore: string;
}

/** The admin sets a year's dues: every farm is charged once, and reminded before the due date. */
export function DuesForm({ defaultYear }: { defaultYear: number }) {
  const save = useSetDues();
  const form = useForm<Values, unknown, DuesSetInput & { year: number }>({
    resolver: sharedSchemaResolver(
      duesSetSchema,
      (v, refuse) => {
        if (!/^\d{4}$/.test(v.year)) refuse('year', 'Enter the year, like 2027');
        return { year: Number(v.year), amountCents: centsFromText(v.amount), dueOn: v.dueOn, reminderDaysBefore: Number(v.reminderDaysBefore) } as DuesSetInput & { year: number };
      },
      (path) => ({ amountCents: 'amount', dueOn: 'dueOn', reminderDaysBefore: 'reminderDaysBefore' } as const)[path as 'dueOn'] ?? null,
    ),
    defaultValues: { year: String(defaultYear), amount: '', dueOn: `${defaultYear}-03-31`, reminderDaysBefore: '14' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, { fields: ['year', 'amount', 'dueOn', 'reminderDaysBefore'] });
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Set the year's dues">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Year" inputMode="numeric" {...form.register('year')} error={errors.year?.message} />
        <TextField label="Dues per farm" inputMode="decimal" placeholder="0.00" {...form.register('amount')} error={errors.amount?.message} />
        <TextField label="Due on" type="date" {...form.register('dueOn')} error={errors.dueOn?.message} />
        <TextField label="Remind days before" inputMode="numeric" {...form.register('reminderDaysBefore')} error={errors.reminderDaysBefore?.message} />
      </div>
      {save.isSuccess && <Alert tone="success">Dues set: every farm is charged, and reminded by e-mail before the due date.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={save.isPending}>Set dues</Button>
    </form>
  );
}
