import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PedigreeCardListDto, PedigreeCardQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from './herd-keys';

export type CardSearch = Partial<Omit<PedigreeCardQuery, 'onFarm'>> & { onFarm?: boolean };

export function getPedigreeCards(query: CardSearch, signal?: AbortSignal): Promise<PedigreeCardListDto> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value !== undefined && value !== '') params.set(key, String(value));
  return apiFetch<PedigreeCardListDto>(`/api/pedigree-cards?${params}`, { signal });
}

export function pedigreeCardsQueryOptions(query: CardSearch) {
  return queryOptions({ queryKey: herdKeys.cards(query), queryFn: ({ signal }) => getPedigreeCards(query, signal) });
}

/** Co-op-wide pedigree cards, for picking a sire, a dam or bucks to try. */
export function usePedigreeCards(query: CardSearch, enabled = true) {
  return useQuery({ ...pedigreeCardsQueryOptions(query), enabled, placeholderData: keepPreviousData });
}
