import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { FeedOverviewDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { feedKeys } from './feed-keys';

export function getFeed(signal?: AbortSignal): Promise<FeedOverviewDto> {
  return apiFetch<FeedOverviewDto>('/api/feed', { signal });
}

export function feedQueryOptions() {
  return queryOptions({ queryKey: feedKeys.book(), queryFn: ({ signal }) => getFeed(signal) });
}

export function useFeed() {
  return useSuspenseQuery(feedQueryOptions());
}
