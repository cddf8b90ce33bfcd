import { useForm, type Resolver } from 'react-hook-form';
import type { PasswordResetRequestInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { loadAuthValidation } from '../load-validation';

const resolver: Resolver<PasswordResetRequestInput> = async (...args) =>
  (await loadAuthValidation()).passwordResetRequestResolver(...args);

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const form = useForm<PasswordResetRequestInput>({ resolver, defaultValues: { email: '' } });
  const { errors } = form.formState;

  const submit = form.handleSubmit((values) => {
    request.mutate(values, {
      onError: (error) => {
        if (applyServerFieldErrors(error, form.setError, ['email'])) request.reset();
      },
    });
  });

  if (request.isSuccess) {
    // Worded so it never reveals whether the address has an account.
    return (
      <Alert tone="success" title="Check your e-mail">
        If {request.variables.email} belongs to a Burrowline account, a link to set a new password is on its way.
        It works once and for a limited time. Nothing there? Look in your spam folder.
      </Alert>
    );
  }

  return (
    <form onSubmit={submit} onFocus={() => void loadAuthValidation()} noValidate className="space-y-5">
      {request.isError && <Alert tone="error" title="Link not sent">{request.error.message}</Alert>}
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.email?.message}
        {...form.register('email')}
      />
      <Button type="submit" className="w-full" isBusy={request.isPending}>
        Send reset link
      </Button>
    </form>
  );
}
