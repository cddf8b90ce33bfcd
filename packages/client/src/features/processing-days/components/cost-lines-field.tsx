import { Plus, Trash2 } from 'lucide-react';
import { useFieldArray, useFormContext } from 'react-hook-form';
import { centsFromText } from '../../ledger';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';

export interface CostLineValues {
  costs: { label: string; amount: string }[];
}

export const costLinesFromValues = (costs: CostLineValues['costs']) =>
  costs.filter((c) => c.label.trim() !== '' || c.amount.trim() !== '').map((c) => ({ label: c.label.trim(), amountCents: centsFromText(c.amount) }));

export const costValuesFromLines = (lines: { label: string; amountCents: number }[]) => lines.map((c) => ({ label: c.label, amount: (c.amountCents / 100).toFixed(2) }));

/** Shared cost lines (bags, ice, gas, site fee) typed as label and amount, inside a form with a `costs` field. */
export function CostLinesField({ legend = 'Shared costs' }: { legend?: string }) {
  const { control, register, formState } = useFormContext<CostLineValues>();
  const lines = useFieldArray({ control, name: 'costs' });
  const errors = formState.errors.costs;
  return (
    <fieldset className="max-w-2xl space-y-2">
      <legend className="font-medium">{legend}</legend>
      {typeof errors?.message === 'string' && <p className="text-sm font-medium text-clay-deep">{errors.message}</p>}
      {lines.fields.map((field, i) => (
        <div key={field.id} className="grid grid-cols-[minmax(0,1fr)_6.5rem_auto] items-end gap-2">
          <TextField label={`Cost ${i + 1}`} error={errors?.[i]?.label?.message} {...register(`costs.${i}.label`)} />
          <TextField label="Amount" inputMode="decimal" placeholder="0.00" error={errors?.[i]?.amount?.message} {...register(`costs.${i}.amount`)} />
          <Button variant="quiet" className="size-12 px-0" aria-label={`Remove cost ${i + 1}`} onClick={() => lines.remove(i)}>
            <Trash2 className="size-5" aria-hidden="true" />
          </Button>
        </div>
      ))}
      <Button variant="secondary" onClick={() => lines.append({ label: '', amount: '' })}>
        <Plus className="size-4" aria-hidden="true" />
        Add a cost
      </Button>
    </fieldset>
  );
}
