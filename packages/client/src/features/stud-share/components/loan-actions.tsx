import { useRef, useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import {
  studCustodyStepSchema, studDeclineSchema, studProposeSchema, weightInputToGrams,
  type StudCustodyStepInput, type StudLoanDto, type StudProposeInput, type WeightUnit,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { WeightInput } from '../../../components/ui/weight-input';
import { formatDate } from '../../../lib/days';
import { errorText } from '../../../lib/form-errors';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import {
  useAcceptRequest, useAnswerProposal, useCancelRequest, useConfirmHandOver, useConfirmReturn, useDeclineRequest, useProposeDates,
  useRecordCustodyStep, useRecordServiceVisit,
} from '../api/loan-steps';
import { periodText } from '../stud-share-labels';

type Step = 'decline' | 'propose' | 'hand-over' | 'return' | 'cancel' | null;

function Failure({ error }: { error: unknown }) {
  return error ? <Alert tone="error">{errorText(error)}</Alert> : null;
}

function Panel({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="space-y-4 rounded-xl border-2 border-moss/40 bg-moss-wash/40 p-4">
      <h3 className="text-lg font-bold">{title}</h3>
      {children}
    </div>
  );
}

function DeclineForm({ loan, onDone }: { loan: StudLoanDto; onDone: () => void }) {
  const decline = useDeclineRequest(loan.id);
  const form = useForm<{ reason: string }, unknown, { version: number; reason: string }>({
    resolver: sharedSchemaResolver(studDeclineSchema, (v) => ({ version: loan.version, reason: v.reason })),
    defaultValues: { reason: '' },
  });
  const { submit, failure } = useServerSubmit(form, decline, { fields: ['reason'], onSuccess: onDone });
  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label="Decline the request">
      <TextField label="Why you decline" hint="They read it as you write it." error={form.formState.errors.reason?.message} {...form.register('reason')} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" variant="danger" isBusy={decline.isPending}>Decline</Button>
        <Button variant="quiet" onClick={onDone}>Keep it open</Button>
      </div>
    </form>
  );
}

function ProposeForm({ loan, today, onDone }: { loan: StudLoanDto; today: string; onDone: () => void }) {
  const propose = useProposeDates(loan.id);
  const form = useForm<{ startOn: string; endOn: string; message: string }, unknown, StudProposeInput>({
    resolver: sharedSchemaResolver(studProposeSchema, (v) => ({ version: loan.version, startOn: v.startOn, endOn: loan.kind === 'service' ? v.startOn : v.endOn, message: v.message })),
    defaultValues: { startOn: loan.startOn, endOn: loan.endOn, message: '' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, propose, { fields: ['startOn', 'endOn', 'message'], onSuccess: onDone });
  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label="Propose other dates">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label={loan.kind === 'loan' ? 'First day' : 'Day of the visit'} type="date" min={today} error={errors.startOn?.message} {...form.register('startOn')} />
        {loan.kind === 'loan' && <TextField label="Last day" type="date" min={today} error={errors.endOn?.message} {...form.register('endOn')} />}
      </div>
      <TextAreaField label="Message (optional)" rows={2} error={errors.message?.message} {...form.register('message')} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" isBusy={propose.isPending}>Send these dates</Button>
        <Button variant="quiet" onClick={onDone}>Back</Button>
      </div>
    </form>
  );
}

interface StepValues {
  on: string;
  major: string;
  minor: string;
  conditionNotes: string;
}

/** A hand-over or a return as one farm saw it: the day, his weight, his condition, a photo. */
function CustodyStepForm({ loan, step, unit, today, onDone }: { loan: StudLoanDto; step: 'hand-over' | 'return'; unit: WeightUnit; today: string; onDone: () => void }) {
  const [photo, setPhoto] = useState<File | null>(null);
  const photoRef = useRef<File | null>(null);
  photoRef.current = photo;
  const record = useRecordCustodyStep(loan.id, step, loan.buck.id, () => photoRef.current);
  const form = useForm<StepValues, unknown, StudCustodyStepInput>({
    resolver: sharedSchemaResolver(
      studCustodyStepSchema,
      (v, refuse) => {
        const typed = v.major.trim() !== '' || v.minor.trim() !== '';
        const grams = typed ? weightInputToGrams(v.major, v.minor, unit) : null;
        if (typed && grams === null) refuse('major', 'Enter his weight as numbers');
        return { version: loan.version, on: v.on, weightGrams: grams, conditionNotes: v.conditionNotes, photoId: null };
      },
      (path) => (path === 'weightGrams' ? 'major' : path === 'on' || path === 'conditionNotes' ? path : null),
    ),
    defaultValues: { on: today, major: '', minor: '', conditionNotes: '' },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, record, {
    fields: (path) => (path === 'weightGrams' ? 'major' : path === 'on' || path === 'conditionNotes' ? path : null),
    onSuccess: onDone,
  });
  const label = step === 'hand-over' ? 'hand-over' : 'return';
  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label={`Record the ${label}`}>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label={step === 'hand-over' ? 'Handed over on' : 'Returned on'} type="date" max={today} error={errors.on?.message} {...form.register('on')} />
        <div className="sm:col-span-2">
          <WeightInput label="His weight" unit={unit} error={errors.major?.message} majorProps={form.register('major')} minorProps={form.register('minor')} />
        </div>
      </div>
      <TextAreaField label="His condition" rows={2} placeholder="Coat, eyes, nose, feet, droppings…" error={errors.conditionNotes?.message} {...form.register('conditionNotes')} />
      <TextField label="A photo of him (optional)" type="file" accept="image/jpeg,image/png,image/webp" onChange={(e) => setPhoto(e.target.files?.[0] ?? null)} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" isBusy={record.isPending}>Record the {label}</Button>
        <Button variant="quiet" onClick={onDone}>Back</Button>
      </div>
    </form>
  );
}

function CancelForm({ loan, onDone }: { loan: StudLoanDto; onDone: () => void }) {
  const cancel = useCancelRequest(loan.id);
  const [reason, setReason] = useState('');
  return (
    <div className="space-y-3">
      <TextField label="Why (optional)" value={reason} maxLength={500} onChange={(e) => setReason(e.target.value)} />
      <Failure error={cancel.error} />
      <div className="flex flex-wrap gap-3">
        <Button variant="danger" isBusy={cancel.isPending} onClick={() => cancel.mutate({ version: loan.version, reason }, { onSuccess: onDone })}>
          Cancel the request
        </Button>
        <Button variant="quiet" onClick={onDone}>Keep it</Button>
      </div>
    </div>
  );
}

/**
 * What the person may do now, as the server says (`actions`): the quick answers are buttons, the rest
 * open a short form in place.
 */
export function LoanActions({ loan, unit, today }: { loan: StudLoanDto; unit: WeightUnit; today: string }) {
  const [open, setOpen] = useState<Step>(null);
  const accept = useAcceptRequest(loan.id);
  const answer = useAnswerProposal(loan.id);
  const confirmHandOver = useConfirmHandOver(loan.id);
  const confirmReturn = useConfirmReturn(loan.id);
  const served = useRecordServiceVisit(loan.id);
  const can = (a: StudLoanDto['actions'][number]) => loan.actions.includes(a);
  const close = () => setOpen(null);
  const error = accept.error ?? answer.error ?? confirmHandOver.error ?? confirmReturn.error ?? served.error;
  if (loan.actions.length === 0) return null;

  if (open) {
    return (
      <Panel title={{ decline: 'Decline the request', propose: 'Propose other dates', 'hand-over': 'Record the hand-over', return: 'Record the return', cancel: 'Cancel the request' }[open]}>
        {open === 'decline' && <DeclineForm loan={loan} onDone={close} />}
        {open === 'propose' && <ProposeForm loan={loan} today={today} onDone={close} />}
        {(open === 'hand-over' || open === 'return') && <CustodyStepForm loan={loan} step={open} unit={unit} today={today} onDone={close} />}
        {open === 'cancel' && <CancelForm loan={loan} onDone={close} />}
      </Panel>
    );
  }
  return (
    <section aria-label="What you can do" className="space-y-3" data-testid="loan-actions">
      {can('answer_proposal') && loan.proposedStartOn && loan.proposedEndOn && (
        <Alert tone="warning" title={`The owner offers ${periodText(loan.proposedStartOn, loan.proposedEndOn)} instead`}>
          You asked for {periodText(loan.startOn, loan.endOn)}.
        </Alert>
      )}
      {can('confirm_hand_over') && loan.handOver && <p>The other farm recorded the hand-over on {formatDate(loan.handOver.on)}. Is that right?</p>}
      {can('confirm_return') && loan.return && <p>The other farm recorded his return on {formatDate(loan.return.on)}. Is that right?</p>}
      <div className="flex flex-wrap gap-3">
        {can('accept') && <Button isBusy={accept.isPending} onClick={() => accept.mutate({ version: loan.version })}>Accept</Button>}
        {can('answer_proposal') && (
          <>
            <Button isBusy={answer.isPending && answer.variables?.accept} onClick={() => answer.mutate({ version: loan.version, accept: true })}>Take these dates</Button>
            <Button variant="secondary" isBusy={answer.isPending && !answer.variables?.accept} onClick={() => answer.mutate({ version: loan.version, accept: false })}>Decline these dates</Button>
          </>
        )}
        {can('propose') && <Button variant="secondary" onClick={() => setOpen('propose')}>Propose other dates</Button>}
        {can('decline') && <Button variant="secondary" onClick={() => setOpen('decline')}>Decline</Button>}
        {can('record_hand_over') && <Button onClick={() => setOpen('hand-over')}>Record the hand-over</Button>}
        {can('confirm_hand_over') && <Button isBusy={confirmHandOver.isPending} onClick={() => confirmHandOver.mutate({ version: loan.version })}>Confirm the hand-over</Button>}
        {can('record_return') && <Button onClick={() => setOpen('return')}>Record the return</Button>}
        {can('confirm_return') && <Button isBusy={confirmReturn.isPending} onClick={() => confirmReturn.mutate({ version: loan.version })}>Confirm the return</Button>}
        {can('record_service') && <Button isBusy={served.isPending} onClick={() => served.mutate({ version: loan.version })}>Record the visit as done</Button>}
        {can('cancel') && <Button variant="quiet" onClick={() => setOpen('cancel')}>Cancel the request</Button>}
      </div>
      <Failure error={error} />
    </section>
  );
}
