import { useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { TextLink } from '../../components/ui/text-link';
import { safeNextPath } from '../../app/route-guards';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { noticeText, readSignInState } from '../../features/auth/sign-in-notice';

export { redirectIfSignedIn as loader } from '../../app/route-guards';

export function SignInPage() {
  const location = useLocation();
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const state = readSignInState(location.state);
  const notice = noticeText(state);
  const next = safeNextPath(searchParams.get('next'));

  return (
    <AuthLayout
      title="Sign in"
      lead="Your co-op's herds, matings and processing days, in one place."
      footer={<TextLink to="/forgot-password">Forgot your password?</TextLink>}
    >
      {notice && <Alert tone={state.notice === 'session-ended' ? 'warning' : 'success'}>{notice}</Alert>}
      <SignInForm defaultEmail={state.email} onSignedIn={() => void navigate(next, { replace: true })} />
    </AuthLayout>
  );
}
