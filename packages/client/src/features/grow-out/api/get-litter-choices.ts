import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { LitterChoiceDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from './grow-out-keys';

export function getLitterChoices(signal?: AbortSignal): Promise<{ litters: LitterChoiceDto[] }> {
  return apiFetch<{ litters: LitterChoiceDto[] }>('/api/grow-out/litter-choices', { signal });
}

export function litterChoicesQueryOptions() {
  return queryOptions({ queryKey: growOutKeys.litterChoices(), queryFn: ({ signal }) => getLitterChoices(signal) });
}

export function useLitterChoices() {
  return useSuspenseQuery(litterChoicesQueryOptions());
}
