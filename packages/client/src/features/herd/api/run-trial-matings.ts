import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrialMatingDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

/** A POST that only computes (it stores nothing), so it is cached like a query keyed by the pair list. */
export function runTrialMatings(damId: string, sireIds: string[], signal?: AbortSignal): Promise<TrialMatingDto> {
  return apiFetch<TrialMatingDto>('/api/trial-matings', { method: 'POST', body: { damId, sireIds }, signal });
}

export function trialMatingsQueryOptions(damId: string, sireIds: string[]) {
  return queryOptions({ queryKey: herdKeys.trial(damId, sireIds), queryFn: ({ signal }) => runTrialMatings(damId, sireIds, signal) });
}

export function useTrialMatings(damId: string, sireIds: string[]) {
  return useQuery({ ...trialMatingsQueryOptions(damId, sireIds), enabled: sireIds.length > 0 });
}
