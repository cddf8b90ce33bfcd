import type { TransferListQuery } from '@burrowline/shared';

export type TransferFilters = Partial<Pick<TransferListQuery, 'kind' | 'from' | 'to' | 'counterparty' | 'farmId'>> & { page: number; pageSize: number };

export const ledgerKeys = {
  all: ['ledger'] as const,
  summary: (farmId?: string) => [...ledgerKeys.all, 'summary', farmId ?? 'own'] as const,
  transfers: (filters: TransferFilters) => [...ledgerKeys.all, 'transfers', filters] as const,
  settleUp: () => [...ledgerKeys.all, 'settle-up'] as const,
  coop: () => [...ledgerKeys.all, 'coop'] as const,
  fees: (scope: string) => [...ledgerKeys.all, 'fees', scope] as const,
  checkout: (id: string) => [...ledgerKeys.all, 'checkout', id] as const,
};
