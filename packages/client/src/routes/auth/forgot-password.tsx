import { TextLink } from '../../components/ui/text-link';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { ForgotPasswordForm } from '../../features/auth/components/forgot-password-form';

export { redirectIfSignedIn as loader } from '../../app/route-guards';

export function ForgotPasswordPage() {
  return (
    <AuthLayout
      title="Forgot your password?"
      lead="Give the e-mail you sign in with and we'll send a link to set a new password."
      footer={<TextLink to="/sign-in">Back to sign in</TextLink>}
    >
      <ForgotPasswordForm />
    </AuthLayout>
  );
}
