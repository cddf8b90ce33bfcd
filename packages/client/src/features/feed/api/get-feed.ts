import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FeedBookQuery, FeedOverviewDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { feedKeys } from './feed-keys';

export function getFeed(page: FeedBookQuery, signal?: AbortSignal): Promise<FeedOverviewDto> {
  return apiFetch<FeedOverviewDto>(`/api/feed?page=${page.page}&pageSize=${page.pageSize}`, { signal });
}

export function feedQueryOptions(page: FeedBookQuery) {
  return queryOptions({ queryKey: feedKeys.book(page), queryFn: ({ signal }) => getFeed(page, signal) });
}

/** The feed book with one page of the feed given; the last page stays on screen while the next one loads. */
export function useFeed(page: FeedBookQuery) {
  return useQuery({ ...feedQueryOptions(page), placeholderData: keepPreviousData });
}
