import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WeighInDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export async function getWeighIns(animalId: string, signal?: AbortSignal): Promise<WeighInDto[]> {
  return (await apiFetch<{ weighIns: WeighInDto[] }>(`/api/animals/${encodeURIComponent(animalId)}/weigh-ins`, { signal })).weighIns;
}

export function weighInsQueryOptions(animalId: string) {
  return queryOptions({ queryKey: herdKeys.weighIns(animalId), queryFn: ({ signal }) => getWeighIns(animalId, signal) });
}

export function useWeighIns(animalId: string, enabled = true) {
  return useQuery({ ...weighInsQueryOptions(animalId), enabled });
}
