import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CardCheckoutDto, CoopLedgerDto, FeesByMonthDto, LedgerSummaryDto, SettleUpDto, TransferListDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { ledgerKeys, type TransferFilters } from './keys';

function query(params: Record<string, string | number | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== '') search.set(key, String(value));
  const text = search.toString();
  return text ? `?${text}` : '';
}

export const summaryQueryOptions = (farmId?: string) =>
  queryOptions({ queryKey: ledgerKeys.summary(farmId), queryFn: ({ signal }) => apiFetch<LedgerSummaryDto>(`/api/ledger/summary${query({ farmId })}`, { signal }) });

export const transfersQueryOptions = (filters: TransferFilters) =>
  queryOptions({
    queryKey: ledgerKeys.transfers(filters),
    queryFn: ({ signal }) => apiFetch<TransferListDto>(`/api/ledger/transfers${query(filters)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const settleUpQueryOptions = () => queryOptions({ queryKey: ledgerKeys.settleUp(), queryFn: ({ signal }) => apiFetch<SettleUpDto>('/api/ledger/settle-up', { signal }) });

export const coopLedgerQueryOptions = () => queryOptions({ queryKey: ledgerKeys.coop(), queryFn: ({ signal }) => apiFetch<CoopLedgerDto>('/api/ledger/coop', { signal }) });

export const feesQueryOptions = (coop: boolean) =>
  queryOptions({ queryKey: ledgerKeys.fees(coop ? 'coop' : 'own'), queryFn: ({ signal }) => apiFetch<FeesByMonthDto>(`/api/ledger/fees-by-month${coop ? '?coop=true' : ''}`, { signal }) });

/** A card checkout; asked again every two seconds while open, besides the live event that settles it. */
export const checkoutQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ledgerKeys.checkout(id),
    queryFn: ({ signal }) => apiFetch<CardCheckoutDto>(`/api/ledger/card-checkouts/${id}`, { signal }),
    refetchInterval: (q) => (q.state.data?.status === 'open' ? 2_000 : false),
  });

export const useLedgerSummary = (farmId?: string) => useQuery(summaryQueryOptions(farmId));
export const useTransfers = (filters: TransferFilters) => useQuery(transfersQueryOptions(filters));
export const useSettleUp = () => useQuery(settleUpQueryOptions());
export const useCoopLedger = () => useQuery(coopLedgerQueryOptions());
export const useFeesByMonth = (coop: boolean) => useQuery(feesQueryOptions(coop));
export const useCardCheckout = (id: string) => useQuery(checkoutQueryOptions(id));
