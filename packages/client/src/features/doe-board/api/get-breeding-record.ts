import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BreedingRecordDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { doeBoardKeys } from './doe-board-keys';

export function breedingRecordQueryOptions(doeId: string) {
  return queryOptions({
    queryKey: doeBoardKeys.record(doeId),
    queryFn: ({ signal }) => apiFetch<BreedingRecordDto>(`/api/almanac/does/${doeId}/breeding-record`, { signal }),
  });
}

export function useBreedingRecord(doeId: string, enabled = true) {
  return useQuery({ ...breedingRecordQueryOptions(doeId), enabled });
}
