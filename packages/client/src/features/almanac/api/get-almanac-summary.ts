import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlmanacSummaryDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getAlmanacSummary(signal?: AbortSignal): Promise<AlmanacSummaryDto> {
  return apiFetch<AlmanacSummaryDto>('/api/almanac/summary', { signal });
}

export function almanacSummaryQueryOptions() {
  return queryOptions({ queryKey: almanacKeys.summary(), queryFn: ({ signal }) => getAlmanacSummary(signal) });
}

/** Commons' "Today" and "This week"; only for someone with a farm. */
export function useAlmanacSummary(enabled: boolean) {
  return useQuery({ ...almanacSummaryQueryOptions(), enabled });
}
