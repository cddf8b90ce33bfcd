import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { PublicCoopDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { applicationKeys } from './application-keys';

/** The co-op's name and rules for its public application form (no sign-in needed). */
export function getPublicCoop(slug: string, signal?: AbortSignal): Promise<PublicCoopDto> {
  return apiFetch<PublicCoopDto>(`/api/apply/${encodeURIComponent(slug)}`, { signal });
}

export function publicCoopQueryOptions(slug: string) {
  return queryOptions({ queryKey: applicationKeys.publicCoop(slug), queryFn: ({ signal }) => getPublicCoop(slug, signal), staleTime: 5 * 60_000 });
}

export function usePublicCoop(slug: string) {
  return useSuspenseQuery(publicCoopQueryOptions(slug));
}
