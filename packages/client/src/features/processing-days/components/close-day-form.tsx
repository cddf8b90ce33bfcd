import { FormProvider, useForm } from 'react-hook-form';
import { dayCloseSchema, type DayCloseInput, type ProcessingDayDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useCloseDay } from '../api/processing-day-mutations';
import { CostLinesField, costLinesFromValues, costValuesFromLines, type CostLineValues } from './cost-lines-field';

const fieldOf = (path: string) => {
  const m = /^actualCosts\.(\d+)\.(label|amountCents)/.exec(path);
  if (!m) return path.startsWith('actualCosts') ? ('costs' as const) : null;
  return `costs.${Number(m[1])}.${m[2] === 'label' ? 'label' : 'amount'}` as const;
};

/**
 * Closing the day: the actual shared costs (the expected ones to start with). The server posts each farm's
 * fee for the head processed and splits the costs by head, to the cent.
 */
export function CloseDayForm({ day }: { day: ProcessingDayDto }) {
  const close = useCloseDay(day.id);
  const form = useForm<CostLineValues, unknown, DayCloseInput>({
    resolver: sharedSchemaResolver(dayCloseSchema, (v) => ({ version: day.version, actualCosts: costLinesFromValues(v.costs) }), fieldOf),
    defaultValues: { costs: costValuesFromLines(day.actualCosts ?? day.expectedCosts ?? []) },
  });
  const { submit, failure } = useServerSubmit(form, close, { fields: fieldOf });
  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate aria-label="Close the day" className="space-y-4">
        <CostLinesField legend="Actual shared costs" />
        {failure && <Alert tone="error">{failure}</Alert>}
        <Button type="submit" isBusy={close.isPending}>Close the day and post fees and costs</Button>
      </form>
    </FormProvider>
  );
}
