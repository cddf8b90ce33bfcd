import { useNavigate, useSearchParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { TextLink } from '../../components/ui/text-link';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { SetPasswordForm } from '../../features/auth/components/set-password-form';
import type { SignInLocationState } from '../../features/auth/sign-in-notice';

export function SetPasswordPage() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const token = searchParams.get('token');

  const goToSignIn = (email: string) => {
    const state: SignInLocationState = { notice: 'password-set', email };
    void navigate('/sign-in', { replace: true, state });
  };

  return (
    <AuthLayout title="Set your password" footer={<TextLink to="/sign-in">Back to sign in</TextLink>}>
      {token ? (
        <SetPasswordForm token={token} onPasswordSet={goToSignIn} />
      ) : (
        <Alert tone="error" title="This link is incomplete" actions={<TextLink to="/forgot-password">Ask for a new link</TextLink>}>
          Open the link from your e-mail again, or ask for a new one.
        </Alert>
      )}
    </AuthLayout>
  );
}
