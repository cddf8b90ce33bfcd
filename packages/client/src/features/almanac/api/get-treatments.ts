import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TreatmentDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getTreatments(signal?: AbortSignal): Promise<{ treatments: TreatmentDto[] }> {
  return apiFetch<{ treatments: TreatmentDto[] }>('/api/treatments', { signal });
}

export function treatmentsQueryOptions() {
  return queryOptions({ queryKey: [...almanacKeys.all, 'treatments'] as const, queryFn: ({ signal }) => getTreatments(signal) });
}

export function useTreatments() {
  return useQuery(treatmentsQueryOptions());
}
