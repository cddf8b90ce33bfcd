import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HeatCautionDto, TemperatureListDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { healthKeys } from './keys';

export function getTemperatures(signal?: AbortSignal): Promise<TemperatureListDto> {
  return apiFetch<TemperatureListDto>('/api/temperature-readings?days=30', { signal });
}

export function temperaturesQueryOptions() {
  return queryOptions({ queryKey: healthKeys.temperatures(), queryFn: ({ signal }) => getTemperatures(signal) });
}

export function useTemperatures() {
  return useQuery(temperaturesQueryOptions());
}

export function getHeatCaution(signal?: AbortSignal): Promise<HeatCautionDto> {
  return apiFetch<HeatCautionDto>('/api/heat-caution', { signal });
}

export function heatCautionQueryOptions() {
  return queryOptions({ queryKey: healthKeys.heat(), queryFn: ({ signal }) => getHeatCaution(signal), refetchInterval: 15 * 60_000 });
}

/** Commons' heat caution: refreshed live when a reading is logged, and every 15 minutes as readings age out. */
export function useHeatCaution(enabled: boolean) {
  return useQuery({ ...heatCautionQueryOptions(), enabled });
}
