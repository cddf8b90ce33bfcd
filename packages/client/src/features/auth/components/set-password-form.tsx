import { useForm } from 'react-hook-form';
import { ErrorCode } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { TextLink } from '../../../components/ui/text-link';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useSetPassword } from '../api/set-password';
import { loadAuthValidation } from '../load-validation';

const passwordRule = 'At least 8 characters, and not a common password.';

interface SetPasswordValues {
  password: string;
  confirmPassword: string;
}

async function checkPassword(value: string): Promise<true | string> {
  return (await loadAuthValidation()).checkNewPassword(value);
}

interface SetPasswordFormProps {
  token: string;
  onPasswordSet: (email: string) => void;
}

export function SetPasswordForm({ token, onPasswordSet }: SetPasswordFormProps) {
  const setPassword = useSetPassword();
  const form = useForm<SetPasswordValues>({ defaultValues: { password: '', confirmPassword: '' } });
  const { errors } = form.formState;

  const submit = form.handleSubmit(({ password }) => {
    setPassword.mutate(
      { token, password },
      {
        onSuccess: ({ email }) => onPasswordSet(email),
        onError: (error) => {
          if (applyServerFieldErrors(error, form.setError, ['password'])) setPassword.reset();
        },
      },
    );
  });

  const linkIsDead = isApiError(setPassword.error, ErrorCode.invalidToken) || Boolean(isApiError(setPassword.error) && setPassword.error.details.token);

  return (
    <form onSubmit={submit} onFocus={() => void loadAuthValidation()} noValidate className="space-y-5">
      {setPassword.isError &&
        (linkIsDead ? (
          <Alert tone="error" title="This link no longer works" actions={<TextLink to="/forgot-password">Ask for a new link</TextLink>}>
            Links to set a password work once and expire after a while.
          </Alert>
        ) : (
          <Alert tone="error" title="Password not set">
            {setPassword.error.message}
          </Alert>
        ))}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={passwordRule}
        error={errors.password?.message}
        {...form.register('password', { validate: checkPassword })}
      />
      <TextField
        label="Confirm password"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...form.register('confirmPassword', {
          validate: (value, values) => value === values.password || 'The two passwords are not the same',
        })}
      />
      <Button type="submit" className="w-full" isBusy={setPassword.isPending}>
        Set password
      </Button>
    </form>
  );
}
