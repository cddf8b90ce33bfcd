import type { AuditEventQuery, MemberListView } from '@burrowline/shared';

/** The roster under ['members'], the audit log under ['audit-events'], the co-op's settings under ['coop']. */
export const memberKeys = {
  all: ['members'] as const,
  lists: () => [...memberKeys.all, 'list'] as const,
  list: (view: MemberListView) => [...memberKeys.lists(), view] as const,
  detail: (userId: string) => [...memberKeys.all, 'detail', userId] as const,
};

export const auditKeys = {
  all: ['audit-events'] as const,
  list: (query: AuditEventQuery) => [...auditKeys.all, 'list', query] as const,
};

export const coopKeys = {
  settings: () => ['coop', 'settings'] as const,
};
