import type { FosteringCreateInput, LitterDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useLitterMutation } from './litter-mutation';

export function recordFostering(litterId: string, input: FosteringCreateInput): Promise<LitterDto> {
  return apiFetch<LitterDto>(`/api/litters/${encodeURIComponent(litterId)}/fosterings`, { method: 'POST', body: input });
}

export function useRecordFostering(litterId: string) {
  return useLitterMutation((input: FosteringCreateInput) => recordFostering(litterId, input));
}
