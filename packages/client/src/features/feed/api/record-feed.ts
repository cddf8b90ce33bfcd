import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FeedOverviewDto, FeedPurchaseCreateBody, FeedPurchaseUpdateBody, FeedUseCreateBody, FeedUseUpdateBody } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from '../../grow-out';
import { feedKeys } from './feed-keys';

function useFeedMutation<V>(request: (variables: V) => Promise<FeedOverviewDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSuccess: async (book) => {
      // A change answers with the first page of the book; every other page is read again.
      const answered = feedKeys.book({ page: book.usesPage, pageSize: book.usesPageSize });
      queryClient.setQueryData(answered, book);
      await queryClient.invalidateQueries({ queryKey: feedKeys.all, predicate: (q) => JSON.stringify(q.queryKey) !== JSON.stringify(answered) });
      // A group's feed conversion and cost follow the feed given.
      await queryClient.invalidateQueries({ queryKey: growOutKeys.all });
    },
  });
}

export const recordPurchase = (body: FeedPurchaseCreateBody) => apiFetch<FeedOverviewDto>('/api/feed/purchases', { method: 'POST', body });
export const useRecordPurchase = () => useFeedMutation(recordPurchase);

export const recordFeedUse = (body: FeedUseCreateBody) => apiFetch<FeedOverviewDto>('/api/feed/uses', { method: 'POST', body });
export const useRecordFeedUse = () => useFeedMutation(recordFeedUse);

export const correctPurchase = ({ id, body }: { id: string; body: FeedPurchaseUpdateBody }) =>
  apiFetch<FeedOverviewDto>(`/api/feed/purchases/${id}`, { method: 'PUT', body });
export const useCorrectPurchase = () => useFeedMutation(correctPurchase);

export const removePurchase = ({ id, version }: { id: string; version: number }) =>
  apiFetch<FeedOverviewDto>(`/api/feed/purchases/${id}?version=${version}`, { method: 'DELETE' });
export const useRemovePurchase = () => useFeedMutation(removePurchase);

export const correctFeedUse = ({ id, body }: { id: string; body: FeedUseUpdateBody }) =>
  apiFetch<FeedOverviewDto>(`/api/feed/uses/${id}`, { method: 'PUT', body });
export const useCorrectFeedUse = () => useFeedMutation(correctFeedUse);

export const removeFeedUse = ({ id, version }: { id: string; version: number }) =>
  apiFetch<FeedOverviewDto>(`/api/feed/uses/${id}?version=${version}`, { method: 'DELETE' });
export const useRemoveFeedUse = () => useFeedMutation(removeFeedUse);
