import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FosterCandidateDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from './litter-keys';

export function getFosterCandidates(litterId: string, signal?: AbortSignal): Promise<{ candidates: FosterCandidateDto[] }> {
  return apiFetch<{ candidates: FosterCandidateDto[] }>(`/api/litters/${encodeURIComponent(litterId)}/foster-candidates`, { signal });
}

export function fosterCandidatesQueryOptions(litterId: string) {
  return queryOptions({ queryKey: litterKeys.fosterCandidates(litterId), queryFn: ({ signal }) => getFosterCandidates(litterId, signal) });
}

/** Nursing litters kindled within a week of this one, here or on another farm (members only). */
export function useFosterCandidates(litterId: string, enabled: boolean) {
  return useQuery({ ...fosterCandidatesQueryOptions(litterId), enabled });
}
