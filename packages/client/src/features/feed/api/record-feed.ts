import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FeedOverviewDto, FeedPurchaseCreateBody, FeedUseCreateBody } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from '../../growout/api/growout-keys';
import { feedKeys } from './feed-keys';

function useFeedMutation<V>(request: (variables: V) => Promise<FeedOverviewDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSuccess: async (book) => {
      queryClient.setQueryData(feedKeys.book(), book);
      // A group's feed conversion and cost follow the feed given.
      await queryClient.invalidateQueries({ queryKey: growOutKeys.all });
    },
  });
}

export const recordPurchase = (body: FeedPurchaseCreateBody) => apiFetch<FeedOverviewDto>('/api/feed/purchases', { method: 'POST', body });
export const useRecordPurchase = () => useFeedMutation(recordPurchase);

export const recordFeedUse = (body: FeedUseCreateBody) => apiFetch<FeedOverviewDto>('/api/feed/uses', { method: 'POST', body });
export const useRecordFeedUse = () => useFeedMutation(recordFeedUse);
