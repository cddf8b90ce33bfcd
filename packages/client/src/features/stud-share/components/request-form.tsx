import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { addDays, studRequestSchema, type BuckCardDto, type StudKind, type StudRequestInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { RadioGroup } from '../../../components/ui/radio-group';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { animalName } from '../../../lib/names';
import { useMoney } from '../../../lib/money';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { breedingStockQueryOptions } from '../../almanac';
import { useRequestStud } from '../api/request-stud';
import { kindHints, kindLabels } from '../stud-share-labels';

interface RequestValues {
  kind: StudKind;
  doeIds: string[];
  startOn: string;
  endOn: string;
  message: string;
}

/**
 * Asks the buck's farm for him: the doe(s) it is for, the dates of a loan or the day of a visit, and a
 * message. The owner is told at once; nothing is booked until they accept.
 */
export function RequestForm({ card, farmId, today, initialDoeId, onDates }: {
  card: BuckCardDto;
  farmId: string;
  today: string;
  initialDoeId?: string;
  /** The dates typed so far, for the calendar beside the form. */
  onDates?: (dates: { startOn: string; endOn: string } | null) => void;
}) {
  const money = useMoney();
  const navigate = useNavigate();
  const request = useRequestStud();
  const id = useRef(newIdempotencyKey());
  const stock = useQuery(breedingStockQueryOptions());
  const does = stock.data?.does ?? [];
  const firstKind: StudKind = card.loan ? 'loan' : 'service';
  const start = addDays(today, 7);
  const form = useForm<RequestValues, unknown, StudRequestInput>({
    resolver: sharedSchemaResolver(studRequestSchema, (v) => ({
      id: id.current,
      offerId: card.offerId,
      kind: v.kind,
      doeIds: v.doeIds,
      farmId,
      startOn: v.startOn,
      endOn: v.kind === 'service' ? v.startOn : v.endOn,
      message: v.message,
    })),
    defaultValues: {
      kind: firstKind,
      doeIds: initialDoeId ? [initialDoeId] : [],
      startOn: start,
      endOn: addDays(start, Math.min(13, card.longestLoanDays - 1)),
      message: '',
    },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, request, {
    fields: ['kind', 'doeIds', 'startOn', 'endOn', 'message'],
    onSuccess: (loan) => navigate(`/stud-share/loans/${loan.id}`, { state: { requested: true } }),
  });
  const kind = form.watch('kind');
  const [startOn, endOn] = form.watch(['startOn', 'endOn']);
  const fee = card.feesVisible ? (kind === 'loan' ? card.loanFeeCents : card.serviceFeeCents) : null;
  useEffect(() => {
    onDates?.(startOn && (kind === 'service' || endOn) ? { startOn, endOn: kind === 'service' ? startOn : endOn } : null);
  }, [onDates, startOn, endOn, kind]);

  return (
    <form noValidate onSubmit={submit} className="space-y-5" aria-label={`Ask for ${card.buck.name || card.buck.tattoo}`}>
      {card.loan && card.service ? (
        <RadioGroup
          legend="What you ask for"
          inline
          error={errors.kind?.message}
          options={(['loan', 'service'] as const).map((k) => ({ value: k, label: kindLabels[k], hint: kindHints[k] }))}
          {...form.register('kind')}
        />
      ) : (
        <p className="font-semibold">{`${kindLabels[firstKind]}: ${kindHints[firstKind].toLowerCase()}.`}</p>
      )}
      <fieldset className="space-y-1">
        <legend className="font-medium">The doe it is for</legend>
        {stock.isPending ? (
          <p className="text-grey-600">Reading your does…</p>
        ) : does.length === 0 ? (
          <p className="text-grey-600">Your farm has no breeding does on record.</p>
        ) : (
          <div className="grid gap-x-4 sm:grid-cols-2">
            {does.map((d) => (
              <CheckboxField key={d.id} label={animalName(d)} value={d.id} {...form.register('doeIds')} />
            ))}
          </div>
        )}
        {errors.doeIds && <p className="text-sm font-medium text-clay-deep">{errors.doeIds.message ?? errors.doeIds.root?.message}</p>}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label={kind === 'loan' ? 'First day with you' : 'Day of the visit'} type="date" min={today} error={errors.startOn?.message} {...form.register('startOn')} />
        {kind === 'loan' && (
          <TextField label="Last day with you" type="date" min={today} error={errors.endOn?.message} {...form.register('endOn')} />
        )}
        {kind === 'loan' && <p className="text-sm text-grey-600 sm:col-span-2">His farm lends him for {card.longestLoanDays} days at most.</p>}
      </div>
      <TextAreaField label="Message (optional)" rows={3} placeholder="What the doe needs, how you would fetch him…" error={errors.message?.message} {...form.register('message')} />
      {card.feesVisible && (
        <p className="text-grey-700">
          {fee
            ? kind === 'loan'
              ? `Fee: ${money(fee)} for the loan. It waits in your Ledger from the owner's yes and is posted at his return.`
              : `Fee: ${money(fee)} per service, posted to your Ledger when the visit is recorded.`
            : 'No fee.'}
        </p>
      )}
      {failure && (
        <Alert tone="error" title="Not sent">
          {failure}
        </Alert>
      )}
      <Button type="submit" isBusy={request.isPending}>
        Send the request
      </Button>
    </form>
  );
}
