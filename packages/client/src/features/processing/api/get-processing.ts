import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcessingListDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { processingKeys } from './keys';

export function getProcessing(signal?: AbortSignal): Promise<ProcessingListDto> {
  return apiFetch<ProcessingListDto>('/api/processing-records', { signal });
}

export function processingQueryOptions() {
  return queryOptions({ queryKey: processingKeys.list(), queryFn: ({ signal }) => getProcessing(signal) });
}

export function useProcessing() {
  return useQuery(processingQueryOptions());
}
