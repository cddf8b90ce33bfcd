import { queryOptions, useQuery } from '@tanstack/react-query';
import { ErrorCode, type MeDto } from '@burrowline/shared';
import { apiFetch, isApiError } from '../../../lib/api-client';

export const meKey = ['me'] as const;

/** Signed out is an ordinary answer here, not an error: `null`. */
export async function getMe(signal?: AbortSignal): Promise<MeDto | null> {
  try {
    return await apiFetch<MeDto>('/api/me', { signal });
  } catch (error) {
    if (isApiError(error, ErrorCode.unauthenticated) || (isApiError(error) && error.status === 401)) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: meKey,
    queryFn: ({ signal }) => getMe(signal),
    // Changes only on sign-in, sign-out or a `session:ended` event, each of which updates the cache.
    staleTime: Infinity,
    // One quick retry for patchy barn Wi-Fi; the sign-in screen should not wait through a long backoff.
    retry: 1,
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}
