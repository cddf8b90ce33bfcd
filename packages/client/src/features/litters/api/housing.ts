import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { HousingUnitCreateInput, HousingUnitDto, PlacementCreateInput, PlacementEndInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from './litter-keys';

const housingKey = [...litterKeys.all, 'housing'] as const;

export function getHousingUnits(signal?: AbortSignal): Promise<{ units: HousingUnitDto[] }> {
  return apiFetch<{ units: HousingUnitDto[] }>('/api/housing-units', { signal });
}

export function housingUnitsQueryOptions() {
  return queryOptions({ queryKey: housingKey, queryFn: ({ signal }) => getHousingUnits(signal) });
}

/** The farm's hutches and pens with who is in each now. */
export function useHousingUnits() {
  return useQuery(housingUnitsQueryOptions());
}

function useHousingMutation<V>(request: (variables: V) => Promise<HousingUnitDto>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: request, onSuccess: () => queryClient.invalidateQueries({ queryKey: litterKeys.all }) });
}

export function useCreateHousingUnit() {
  return useHousingMutation((input: HousingUnitCreateInput) => apiFetch<HousingUnitDto>('/api/housing-units', { method: 'POST', body: input }));
}

/** Moves an animal or a litter into a unit from a date; its previous place ends that day. */
export function usePlaceInUnit() {
  return useHousingMutation(({ unitId, input }: { unitId: string; input: PlacementCreateInput }) =>
    apiFetch<HousingUnitDto>(`/api/housing-units/${encodeURIComponent(unitId)}/placements`, { method: 'POST', body: input }));
}

export function useEndPlacement() {
  return useHousingMutation(({ placementId, input }: { placementId: string; input: PlacementEndInput }) =>
    apiFetch<HousingUnitDto>(`/api/housing-placements/${encodeURIComponent(placementId)}/end`, { method: 'POST', body: input }));
}
