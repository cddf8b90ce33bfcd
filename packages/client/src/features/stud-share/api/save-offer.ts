import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BuckCardDto, StudOfferBody } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { studShareKeys } from './stud-share-keys';

function useOfferMutation<TBody>(send: (body: TBody) => Promise<BuckCardDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (card) => {
      queryClient.setQueryData(studShareKeys.offer(card.offerId), card);
      void queryClient.invalidateQueries({ queryKey: studShareKeys.all });
    },
  });
}

const offerPath = (offerId: string) => `/api/stud-share/offers/${encodeURIComponent(offerId)}`;

/** Offers a buck of the farm (a new buck card for the co-op). */
export const useOfferBuck = () => useOfferMutation((body: StudOfferBody) => apiFetch<BuckCardDto>('/api/stud-share/offers', { method: 'POST', body }));

/** Edits an offer; the version seen travels with it (two members of a farm may edit). */
export const useUpdateOffer = (offerId: string, version: number) =>
  useOfferMutation((offer: StudOfferBody) => apiFetch<BuckCardDto>(offerPath(offerId), { method: 'PUT', body: { version, offer } }));

/** Withdraws (hides the card; accepted loans stay) or publishes again. */
export const useSetOfferPublished = (offerId: string) =>
  useOfferMutation(({ publish, version }: { publish: boolean; version: number }) =>
    apiFetch<BuckCardDto>(`${offerPath(offerId)}/${publish ? 'publish' : 'withdraw'}`, { method: 'POST', body: { version } }),
  );
