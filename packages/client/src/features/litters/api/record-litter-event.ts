import type { LitterDto, LitterEventCreateInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useLitterMutation } from './litter-mutation';

/** Lost (with a cause), culled or weaned; refused with the sum when more kits would leave than are with the doe. */
export function recordLitterEvent(litterId: string, input: LitterEventCreateInput): Promise<LitterDto> {
  return apiFetch<LitterDto>(`/api/litters/${encodeURIComponent(litterId)}/events`, { method: 'POST', body: input });
}

export function useRecordLitterEvent(litterId: string) {
  return useLitterMutation((input: LitterEventCreateInput) => recordLitterEvent(litterId, input));
}
