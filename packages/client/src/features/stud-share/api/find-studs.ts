import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StudFinderDto, StudFinderQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { searchOf, studShareKeys } from './stud-share-keys';

export type FinderQuery = Partial<Omit<StudFinderQuery, 'freeOnly'>> & { damId: string; freeOnly?: boolean };

export const finderQueryOptions = (query: FinderQuery) =>
  queryOptions({
    queryKey: studShareKeys.finder(query),
    queryFn: ({ signal }) => apiFetch<StudFinderDto>(`/api/stud-share/finder${searchOf(query)}`, { signal }),
    placeholderData: keepPreviousData,
  });

/** Every offered buck of the co-op, ranked for one doe. */
export const useStudFinder = (query: FinderQuery, enabled = true) => useQuery({ ...finderQueryOptions(query), enabled });
