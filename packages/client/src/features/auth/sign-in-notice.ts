/** What the sign-in page should tell someone who was sent there; passed as router location state. */
export interface SignInLocationState {
  notice?: 'signed-out' | 'session-ended' | 'password-set';
  reason?: string;
  email?: string;
}

export function readSignInState(state: unknown): SignInLocationState {
  if (typeof state !== 'object' || state === null) return {};
  const { notice, reason, email } = state as Record<string, unknown>;
  return {
    notice: notice === 'signed-out' || notice === 'session-ended' || notice === 'password-set' ? notice : undefined,
    reason: typeof reason === 'string' ? reason : undefined,
    email: typeof email === 'string' ? email : undefined,
  };
}

const endedBecause: Record<string, string> = {
  role_changed: 'Your role in the co-op changed. Sign in again to carry on.',
  disabled: 'Your account has been turned off by the co-op. Ask your coordinator if this is a surprise.',
};

export function noticeText({ notice, reason }: SignInLocationState): string | null {
  switch (notice) {
    case 'signed-out':
      return 'You have signed out.';
    case 'password-set':
      return 'Your password is set. Sign in with it now.';
    case 'session-ended':
      return (reason ? endedBecause[reason] : undefined) ?? 'Your session has ended. Sign in again to carry on.';
    default:
      return null;
  }
}
