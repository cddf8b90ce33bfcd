import { useForm, type Resolver } from 'react-hook-form';
import { ErrorCode, type SignInInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useSignIn } from '../api/sign-in';
import { loadAuthValidation } from '../load-validation';

const resolver: Resolver<SignInInput> = async (...args) => (await loadAuthValidation()).signInResolver(...args);

function failureText(error: unknown): string {
  if (isApiError(error, ErrorCode.invalidCredentials)) {
    return "That e-mail and password don't match an active account. Check both and try again.";
  }
  if (isApiError(error, ErrorCode.rateLimited)) return 'Too many sign-in attempts. Wait a few minutes, then try again.';
  return error instanceof Error ? error.message : 'Signing in did not work. Try again.';
}

interface SignInFormProps {
  defaultEmail?: string;
  onSignedIn: () => void;
}

export function SignInForm({ defaultEmail = '', onSignedIn }: SignInFormProps) {
  const signIn = useSignIn();
  const form = useForm<SignInInput>({ resolver, defaultValues: { email: defaultEmail, password: '' } });
  const { errors } = form.formState;

  const submit = form.handleSubmit((values) => {
    signIn.mutate(values, {
      onSuccess: onSignedIn,
      onError: (error) => {
        if (applyServerFieldErrors(error, form.setError, ['email', 'password'])) signIn.reset();
      },
    });
  });

  return (
    <form onSubmit={submit} onFocus={() => void loadAuthValidation()} noValidate className="space-y-5">
      {signIn.isError && <Alert tone="error" title="Not signed in">{failureText(signIn.error)}</Alert>}
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
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...form.register('password')}
      />
      <Button type="submit" className="w-full" isBusy={signIn.isPending}>
        Sign in
      </Button>
    </form>
  );
}
