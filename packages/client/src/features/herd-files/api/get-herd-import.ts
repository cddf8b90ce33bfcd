import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { HerdImportDto, HerdImportRowsQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdFileKeys } from './herd-file-keys';

export function getHerdImport(importId: string, query: HerdImportRowsQuery, signal?: AbortSignal): Promise<HerdImportDto> {
  const params = new URLSearchParams({ show: query.show, page: String(query.page), pageSize: String(query.pageSize) });
  return apiFetch<HerdImportDto>(`/api/herd-imports/${encodeURIComponent(importId)}?${params}`, { signal });
}

export function herdImportQueryOptions(importId: string, query: HerdImportRowsQuery) {
  return queryOptions({ queryKey: herdFileKeys.import(importId, query), queryFn: ({ signal }) => getHerdImport(importId, query, signal) });
}

/** A staged import's preview; while another page or filter loads, the rows shown stay (dimmed). */
export function useHerdImport(importId: string | null, query: HerdImportRowsQuery) {
  return useQuery({ ...herdImportQueryOptions(importId ?? '', query), enabled: Boolean(importId), placeholderData: keepPreviousData });
}
