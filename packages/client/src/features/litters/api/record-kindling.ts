import type { KindlingCreateBody, LitterDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useLitterMutation } from './litter-mutation';

/** 422 `confirmation_required` when outside the kindling window; resend with `confirm: true`. */
export function recordKindling(input: KindlingCreateBody): Promise<LitterDto> {
  return apiFetch<LitterDto>('/api/litters', { method: 'POST', body: input });
}

export function useRecordKindling() {
  return useLitterMutation(recordKindling);
}
