import { useForm } from 'react-hook-form';
import { paymentCreateSchema, type PaymentCreateInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useRecordPayment } from '../api/ledger-mutations';
import { centsFromText } from './money-input';

interface Values {
  id: string;
  to: string;
  amount: string;
  method: 'cash' | 'cheque' | 'bank_transfer';
  paidOn: string;
  memo: string;
  duesYear: string;
}

/**
 * A payment made outside the app (cash, cheque, bank transfer). It is recorded as pending and posts only
 * when the farm paid (or the co-op's admin, for a payment to the co-op) confirms it.
 */
export function RecordPaymentForm({ farms, duesYears, today }: { farms: { id: string; name: string }[]; duesYears: number[]; today: string }) {
  const save = useRecordPayment();
  const form = useForm<Values, unknown, PaymentCreateInput>({
    resolver: sharedSchemaResolver(paymentCreateSchema, (v) => ({
      id: v.id,
      toFarmId: v.to === 'coop' ? null : v.to,
      amountCents: centsFromText(v.amount),
      method: v.method,
      paidOn: v.paidOn,
      memo: v.memo,
      ...(v.duesYear ? { duesYear: Number(v.duesYear) } : {}),
    }), (path) => ({ toFarmId: 'to', amountCents: 'amount', method: 'method', paidOn: 'paidOn', memo: 'memo', duesYear: 'duesYear' } as const)[path as 'memo'] ?? null),
    defaultValues: { id: `payment:${newIdempotencyKey()}`, to: 'coop', amount: '', method: 'cash', paidOn: today, memo: '', duesYear: '' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, {
    fields: ['to', 'amount', 'method', 'paidOn', 'memo', 'duesYear'],
    onSuccess: () => form.reset({ ...form.getValues(), id: `payment:${newIdempotencyKey()}`, amount: '', memo: '' }),
  });
  const to = form.watch('to');
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Record a payment">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Paid to" {...form.register('to')} error={errors.to?.message} options={[{ value: 'coop', label: 'The co-op' }, ...farms.map((f) => ({ value: f.id, label: f.name }))]} />
        <TextField label="Amount" inputMode="decimal" placeholder="0.00" {...form.register('amount')} error={errors.amount?.message} />
        <SelectField
          label="How"
          {...form.register('method')}
          error={errors.method?.message}
          options={[{ value: 'cash', label: 'Cash' }, { value: 'cheque', label: 'Cheque' }, { value: 'bank_transfer', label: 'Bank transfer' }]}
        />
        <TextField label="Paid on" type="date" {...form.register('paidOn')} error={errors.paidOn?.message} />
        {to === 'coop' && duesYears.length > 0 && (
          <SelectField label="Towards" {...form.register('duesYear')} error={errors.duesYear?.message} options={[{ value: '', label: 'The balance' }, ...duesYears.map((y) => ({ value: String(y), label: `${y} dues` }))]} />
        )}
        <TextField label="Note (optional)" {...form.register('memo')} error={errors.memo?.message} />
      </div>
      {save.isSuccess && <Alert tone="success">Recorded. It posts once {to === 'coop' ? "the co-op's admin" : 'the other farm'} confirms it.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={save.isPending}>Record payment</Button>
    </form>
  );
}
