import type { QueryClient } from '@tanstack/react-query';
import type { NavigateOptions } from 'react-router-dom';
import { meKey } from './api/get-me';
import type { SignInLocationState } from './sign-in-notice';

type Navigate = (to: string, options: NavigateOptions) => void | Promise<void>;

/** Sign-out, a revoked session and an expired one all end the same way: no socket, no cached data, sign-in page. */
export async function leaveSignedInArea(queryClient: QueryClient, navigate: Navigate, state: SignInLocationState): Promise<void> {
  // The socket is already loaded when anyone is signed in, so this import costs nothing.
  void import('../../lib/socket').then(({ disconnectRealtime }) => disconnectRealtime());
  // Null first, so the sign-in route does not bounce back; the rest only after the signed-in screens unmount.
  queryClient.setQueryData(meKey, null);
  await navigate('/sign-in', { replace: true, state });
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKey[0] });
}
