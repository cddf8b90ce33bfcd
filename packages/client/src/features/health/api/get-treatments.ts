import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TreatmentDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { healthKeys } from './keys';

export function getTreatments(signal?: AbortSignal): Promise<{ treatments: TreatmentDto[] }> {
  return apiFetch<{ treatments: TreatmentDto[] }>('/api/treatments', { signal });
}

export function healthTreatmentsQueryOptions() {
  return queryOptions({ queryKey: healthKeys.treatments(), queryFn: ({ signal }) => getTreatments(signal) });
}

export function useHealthTreatments() {
  return useQuery(healthTreatmentsQueryOptions());
}
