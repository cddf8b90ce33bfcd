import { zodResolver } from '@hookform/resolvers/zod';
import { Check, Undo2, X } from 'lucide-react';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import {
  applicationApprovalSchema,
  applicationRejectionSchema,
  applicationWithdrawalSchema,
  ErrorCode,
  type ApplicationApprovalInput,
  type ApplicationDto,
  type ApplicationRejectionInput,
  type ApplicationWithdrawalInput,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useApproveApplication } from '../api/approve-application';
import { useRejectApplication } from '../api/reject-application';
import { useWithdrawApplication } from '../api/withdraw-application';

type Choice = 'approve' | 'reject' | 'withdraw';

interface FormProps {
  application: ApplicationDto;
  onCancel: () => void;
  /** Another admin decided first: the page shows their decision and this message above it. */
  onConflict: (message: string) => void;
}

function isConflict(error: unknown): error is Error {
  return isApiError(error, ErrorCode.conflict) && Object.keys((error as { details: object }).details).length === 0;
}

function failure(error: unknown) {
  return (
    <Alert tone="error" title="Not saved">
      {error instanceof Error ? error.message : 'Try again.'}
    </Alert>
  );
}

function ApproveForm({ application, onCancel, onConflict }: FormProps) {
  const approve = useApproveApplication(application.id);
  const form = useForm<ApplicationApprovalInput>({ resolver: zodResolver(applicationApprovalSchema), defaultValues: { farmName: application.farmName } });
  const submit = form.handleSubmit((values) =>
    approve.mutate(values, {
      onError: (error) => {
        if (isConflict(error)) onConflict(error.message);
        else if (applyServerFieldErrors(error, form.setError, ['farmName'])) approve.reset();
      },
    }),
  );
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {approve.isError && failure(approve.error)}
      <p>
        {application.applicantName} becomes a member and their farm joins the directory, with the location, time zone and
        breeds from the application. A link to set a password goes to <strong>{application.email}</strong>.
      </p>
      <TextField
        label="Farm name"
        hint="Change it only if it clashes with a farm already in the co-op; the member can edit their profile later."
        error={form.formState.errors.farmName?.message}
        {...form.register('farmName')}
      />
      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" isBusy={approve.isPending}>
          <Check className="size-4" aria-hidden="true" />
          Approve and send link
        </Button>
      </div>
    </form>
  );
}

function RejectForm({ application, onCancel, onConflict }: FormProps) {
  const reject = useRejectApplication(application.id);
  const form = useForm<ApplicationRejectionInput>({ resolver: zodResolver(applicationRejectionSchema), defaultValues: { reason: '' } });
  const submit = form.handleSubmit((values) =>
    reject.mutate(values, {
      onError: (error) => {
        if (isConflict(error)) onConflict(error.message);
        else if (applyServerFieldErrors(error, form.setError, ['reason'])) reject.reset();
      },
    }),
  );
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {reject.isError && failure(reject.error)}
      <TextAreaField
        label="Reason"
        hint={`Sent to ${application.applicantName} in the e-mail, as you write it. Say what would change the answer, if anything.`}
        rows={4}
        error={form.formState.errors.reason?.message}
        {...form.register('reason')}
      />
      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" variant="danger" isBusy={reject.isPending}>
          <X className="size-4" aria-hidden="true" />
          Reject and send e-mail
        </Button>
      </div>
    </form>
  );
}

function WithdrawForm({ application, onCancel, onConflict }: FormProps) {
  const withdraw = useWithdrawApplication(application.id);
  const form = useForm<ApplicationWithdrawalInput>({ resolver: zodResolver(applicationWithdrawalSchema), defaultValues: { note: '' } });
  const submit = form.handleSubmit((values) =>
    withdraw.mutate(values, { onError: (error) => void (isConflict(error) && onConflict(error.message)) }),
  );
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {withdraw.isError && failure(withdraw.error)}
      <p>For when {application.applicantName} has told you they no longer want to join. Nothing is e-mailed.</p>
      <TextAreaField label="Note (optional)" rows={3} error={form.formState.errors.note?.message} {...form.register('note')} />
      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" isBusy={withdraw.isPending}>
          Mark withdrawn
        </Button>
      </div>
    </form>
  );
}

/** The admin's decision on a pending application: approve, reject with a reason, or record a withdrawal. */
export function DecisionPanel({ application, onConflict }: { application: ApplicationDto; onConflict: (message: string) => void }) {
  const [choice, setChoice] = useState<Choice | null>(null);
  const cancel = () => setChoice(null);
  const props = { application, onCancel: cancel, onConflict };
  return (
    <Card className="space-y-4 border-2 border-straw">
      <h2 className="text-xl font-bold">Your decision</h2>
      {choice === null && (
        <div className="flex flex-col gap-3 sm:flex-row">
          <Button onClick={() => setChoice('approve')}>
            <Check className="size-4" aria-hidden="true" />
            Approve
          </Button>
          <Button variant="danger" onClick={() => setChoice('reject')}>
            <X className="size-4" aria-hidden="true" />
            Reject
          </Button>
          <Button variant="secondary" onClick={() => setChoice('withdraw')}>
            <Undo2 className="size-4" aria-hidden="true" />
            Mark withdrawn
          </Button>
        </div>
      )}
      {choice === 'approve' && <ApproveForm {...props} />}
      {choice === 'reject' && <RejectForm {...props} />}
      {choice === 'withdraw' && <WithdrawForm {...props} />}
    </Card>
  );
}
