import { queryOptions, useMutation, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import type { WeighingRoundCandidatesDto, WeighingRoundCreateBody, WeighingRoundDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';

/** What a round weighs, from the address: `set=group&groupId=…`, `set=litter&litterId=…`, `set=growing`, `set=animals&animalIds=a,b`. */
export type RoundSet = Record<string, string>;

export const weighingRoundKeys = {
  all: ['weighing-rounds'] as const,
  candidates: (set: RoundSet) => ['weighing-rounds', 'candidates', set] as const,
};

export function candidatesQueryOptions(set: RoundSet) {
  return queryOptions({
    queryKey: weighingRoundKeys.candidates(set),
    queryFn: ({ signal }) => apiFetch<WeighingRoundCandidatesDto>(`/api/weighing-rounds/candidates?${new URLSearchParams(set)}`, { signal }),
    // The round keeps the list it started with; a refetch mid-round would renumber the kits.
    staleTime: Infinity,
  });
}

export const useRoundCandidates = (set: RoundSet) => useSuspenseQuery(candidatesQueryOptions(set));

/** Saves the whole round in one request; its id makes a retry harmless. */
export function useSaveRound() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: WeighingRoundCreateBody) => apiFetch<WeighingRoundDto>('/api/weighing-rounds', { method: 'POST', body }),
    onSuccess: async () => {
      // Weights show on animals, groups and litters: every cached screen of them is stale.
      await queryClient.invalidateQueries();
    },
  });
}
