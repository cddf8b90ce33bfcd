import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { BuckCardDto, BuckCardListDto, StudAvailabilityDto, StudOfferListQuery } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { searchOf, studShareKeys } from './stud-share-keys';

export const buckCardsQueryOptions = (query: Partial<StudOfferListQuery>) =>
  queryOptions({
    queryKey: studShareKeys.offerList(query),
    queryFn: ({ signal }) => apiFetch<BuckCardListDto>(`/api/stud-share/offers${searchOf(query)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const buckCardQueryOptions = (offerId: string) =>
  queryOptions({
    queryKey: studShareKeys.offer(offerId),
    queryFn: ({ signal }) => apiFetch<BuckCardDto>(`/api/stud-share/offers/${encodeURIComponent(offerId)}`, { signal }),
  });

export const availabilityQueryOptions = (offerId: string, from: string, to: string) =>
  queryOptions({
    queryKey: studShareKeys.availability(offerId, from, to),
    queryFn: ({ signal }) => apiFetch<StudAvailabilityDto>(`/api/stud-share/offers/${encodeURIComponent(offerId)}/availability${searchOf({ from, to })}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const useBuckCards = (query: Partial<StudOfferListQuery>) => useQuery(buckCardsQueryOptions(query));
export const useBuckCard = (offerId: string) => useQuery(buckCardQueryOptions(offerId));
export const useAvailability = (offerId: string, from: string, to: string) => useQuery(availabilityQueryOptions(offerId, from, to));
