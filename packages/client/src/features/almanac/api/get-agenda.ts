import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AgendaDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export interface AgendaRange {
  from?: string;
  to?: string;
  days?: number;
  include?: 'open' | 'all';
}

export function getAgenda(range: AgendaRange, signal?: AbortSignal): Promise<AgendaDto> {
  const query = new URLSearchParams(Object.entries(range).filter(([, v]) => v !== undefined).map(([k, v]) => [k, String(v)]));
  return apiFetch<AgendaDto>(`/api/almanac/tasks${query.size ? `?${query}` : ''}`, { signal });
}

export function agendaQueryOptions(range: AgendaRange) {
  return queryOptions({ queryKey: almanacKeys.agenda(range), queryFn: ({ signal }) => getAgenda(range, signal), placeholderData: keepPreviousData });
}

/** The agenda or a month; keeps showing the last range while the next one loads (paging months). */
export function useAgenda(range: AgendaRange) {
  return useQuery(agendaQueryOptions(range));
}
