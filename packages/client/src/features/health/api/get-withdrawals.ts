import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WithdrawalStateDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { healthKeys } from './keys';

type Subject = { animalId?: string; groupId?: string };

export function getWithdrawals(subject: Subject, signal?: AbortSignal): Promise<WithdrawalStateDto> {
  const params = new URLSearchParams(Object.entries(subject).filter(([, v]) => Boolean(v)) as [string, string][]);
  return apiFetch<WithdrawalStateDto>(`/api/withdrawals${params.size > 0 ? `?${params}` : ''}`, { signal });
}

export function withdrawalsQueryOptions(subject: Subject = {}) {
  return queryOptions({ queryKey: healthKeys.withdrawals(subject), queryFn: ({ signal }) => getWithdrawals(subject, signal) });
}

/** What is under a veterinarian's withdrawal today: one animal's or group's, or the whole farm's. */
export function useWithdrawals(subject: Subject = {}) {
  return useQuery(withdrawalsQueryOptions(subject));
}
