import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CardCheckoutCreateInput, CardCheckoutDto, CoopLedgerDto, DuesSetInput, PaymentCreateInput, TransferDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { ledgerKeys } from './keys';

function useLedgerMutation<TBody, TResult>(send: (body: TBody) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: ledgerKeys.all }),
  });
}

export const useRecordPayment = () => useLedgerMutation((body: PaymentCreateInput) => apiFetch<TransferDto>('/api/ledger/payments', { method: 'POST', body }));
export const useConfirmTransfer = () => useLedgerMutation((id: string) => apiFetch<TransferDto>(`/api/ledger/transfers/${encodeURIComponent(id)}/confirmation`, { method: 'POST' }));
export const useVoidTransfer = () => useLedgerMutation((id: string) => apiFetch<TransferDto>(`/api/ledger/transfers/${encodeURIComponent(id)}/void`, { method: 'POST' }));
export const useSetDues = () =>
  useLedgerMutation(({ year, ...body }: DuesSetInput & { year: number }) => apiFetch<CoopLedgerDto>(`/api/ledger/dues/${year}`, { method: 'PUT', body }));
export const useOpenCardCheckout = () => useMutation({ mutationFn: (body: CardCheckoutCreateInput) => apiFetch<CardCheckoutDto>('/api/ledger/card-checkouts', { method: 'POST', body }) });
