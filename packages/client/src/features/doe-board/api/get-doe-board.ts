import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DoeBoardDto, DoeBoardQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { doeBoardKeys } from './doe-board-keys';

export function getDoeBoard(query: DoeBoardQuery, signal?: AbortSignal): Promise<DoeBoardDto> {
  const params = new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]));
  return apiFetch<DoeBoardDto>(`/api/almanac/doe-board?${params}`, { signal });
}

export function doeBoardQueryOptions(query: DoeBoardQuery) {
  return queryOptions({ queryKey: doeBoardKeys.board(query), queryFn: ({ signal }) => getDoeBoard(query, signal) });
}

/** The farm's does and where each stands; a new sort keeps the old rows (dimmed) until it loads. */
export function useDoeBoard(query: DoeBoardQuery) {
  return useQuery({ ...doeBoardQueryOptions(query), placeholderData: keepPreviousData });
}
