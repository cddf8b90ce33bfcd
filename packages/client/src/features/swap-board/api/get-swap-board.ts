import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type {
  SwapBoardSummaryDto, SwapListingListDto, SwapListingPageDto, SwapListingQuery, SwapOfferListDto, SwapOfferListQuery,
} from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { searchOf, swapBoardKeys } from './swap-board-keys';

export const listingsQueryOptions = (query: Partial<SwapListingQuery>) =>
  queryOptions({
    queryKey: swapBoardKeys.listingList(query),
    queryFn: ({ signal }) => apiFetch<SwapListingListDto>(`/api/swap-board/listings${searchOf(query)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const listingPageQueryOptions = (listingId: string) =>
  queryOptions({
    queryKey: swapBoardKeys.listing(listingId),
    queryFn: ({ signal }) => apiFetch<SwapListingPageDto>(`/api/swap-board/listings/${encodeURIComponent(listingId)}`, { signal }),
  });

export const swapOffersQueryOptions = (query: Partial<SwapOfferListQuery>) =>
  queryOptions({
    queryKey: swapBoardKeys.offerList(query),
    queryFn: ({ signal }) => apiFetch<SwapOfferListDto>(`/api/swap-board/offers${searchOf(query)}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const swapSummaryQueryOptions = () =>
  queryOptions({ queryKey: swapBoardKeys.summary(), queryFn: ({ signal }) => apiFetch<SwapBoardSummaryDto>('/api/swap-board/summary', { signal }) });

export const useListings = (query: Partial<SwapListingQuery>) => useQuery(listingsQueryOptions(query));
export const useListingPage = (listingId: string) => useQuery(listingPageQueryOptions(listingId));
export const useSwapOffers = (query: Partial<SwapOfferListQuery>, enabled = true) => useQuery({ ...swapOffersQueryOptions(query), enabled });
export const useSwapSummary = () => useQuery(swapSummaryQueryOptions());
