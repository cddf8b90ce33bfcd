import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  SwapAcceptInput, SwapCounterInput, SwapListingDto, SwapListingEditInput, SwapListingInput, SwapOfferDto, SwapOfferInput, SwapReasonInput, SwapVersionInput,
} from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { swapBoardKeys } from './swap-board-keys';

function useRefreshAfter() {
  const queryClient = useQueryClient();
  return () => void queryClient.invalidateQueries({ queryKey: swapBoardKeys.all });
}

/** Lists breeding stock, grow-out or a wanted post; the client-chosen id makes a retry harmless. */
export function useCreateListing() {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SwapListingInput) => apiFetch<SwapListingDto>('/api/swap-board/listings', { method: 'POST', body }),
    onSuccess: refresh,
  });
}

/** The seller's edit of a draft or open listing; the version refuses a second editor's stale form (409). */
export function useEditListing(listingId: string) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SwapListingEditInput) => apiFetch<SwapListingDto>(`/api/swap-board/listings/${encodeURIComponent(listingId)}`, { method: 'PATCH', body }),
    onSuccess: refresh,
  });
}

export function useListingStep(listingId: string, step: 'publish' | 'withdraw') {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SwapVersionInput | SwapReasonInput) =>
      apiFetch<SwapListingDto>(`/api/swap-board/listings/${encodeURIComponent(listingId)}/${step}`, { method: 'POST', body }),
    onSuccess: refresh,
  });
}

/** Offers on a listing; the client-chosen id is the offer's idempotency key. */
export function useMakeOffer() {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SwapOfferInput) => apiFetch<SwapOfferDto>('/api/swap-board/offers', { method: 'POST', body }),
    onSuccess: refresh,
  });
}

export type OfferStep = 'counter' | 'accept' | 'decline' | 'withdraw' | 'collected' | 'hand-over-failed';

/** One answer on an offer; accepting also moves the animals, so the herd and the Almanac refetch through their live events. */
export function useOfferStep(offerId: string, step: OfferStep) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SwapCounterInput | SwapAcceptInput | SwapReasonInput | SwapVersionInput) =>
      apiFetch<SwapOfferDto>(`/api/swap-board/offers/${encodeURIComponent(offerId)}/${step}`, { method: 'POST', body }),
    onSuccess: refresh,
  });
}
