import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { ErrorCode } from '@burrowline/shared';
import { isApiError } from '../lib/api-client';

let handleSessionLost: () => void = () => {};

/** The router registers what to do when the server says the session is gone (expired, revoked). */
export function onSessionLost(handler: () => void): void {
  handleSessionLost = handler;
}

function reportIfSessionLost(error: unknown): void {
  if (isApiError(error, ErrorCode.unauthenticated)) handleSessionLost();
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({
    // The ['me'] query answers "signed out" with null instead of failing, so it never lands here.
    onError: reportIfSessionLost,
  }),
  mutationCache: new MutationCache({ onError: reportIfSessionLost }),
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // A 4xx will not fix itself; a dropped connection or a 5xx might.
      retry: (failureCount, error) => {
        if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
        return failureCount < 2;
      },
    },
    mutations: { retry: false },
  },
});
