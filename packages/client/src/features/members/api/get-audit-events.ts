import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventListDto, AuditEventQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { auditKeys } from './member-keys';

export function getAuditEvents(query: AuditEventQuery, signal?: AbortSignal): Promise<AuditEventListDto> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value !== undefined) params.set(key, String(value));
  return apiFetch<AuditEventListDto>(`/api/audit-events?${params}`, { signal });
}

export function auditEventsQueryOptions(query: AuditEventQuery) {
  return queryOptions({ queryKey: auditKeys.list(query), queryFn: ({ signal }) => getAuditEvents(query, signal) });
}

export function useAuditEvents(query: AuditEventQuery) {
  return useQuery({ ...auditEventsQueryOptions(query), placeholderData: keepPreviousData });
}
