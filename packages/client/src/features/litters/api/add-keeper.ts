import type { KeeperCreateInput, LitterDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useLitterMutation } from './litter-mutation';

/** A kit kept with its own record; sire, dam and birth date come from the litter it was born in. */
export function addKeeper(litterId: string, input: KeeperCreateInput): Promise<LitterDto> {
  return apiFetch<LitterDto>(`/api/litters/${encodeURIComponent(litterId)}/keepers`, { method: 'POST', body: input });
}

export function useAddKeeper(litterId: string) {
  return useLitterMutation((input: KeeperCreateInput) => addKeeper(litterId, input));
}
