import type { SwapListingQuery, SwapOfferListQuery } from '@burrowline/shared';

/** Every Swap Board query lives under ['swap-board']: a listing's or an offer's change refreshes the board, pages and offers. */
export const swapBoardKeys = {
  all: ['swap-board'] as const,
  listings: () => [...swapBoardKeys.all, 'listings'] as const,
  listingList: (query: Partial<SwapListingQuery>) => [...swapBoardKeys.listings(), 'list', query] as const,
  listing: (listingId: string) => [...swapBoardKeys.listings(), 'detail', listingId] as const,
  offers: () => [...swapBoardKeys.all, 'offers'] as const,
  offerList: (query: Partial<SwapOfferListQuery>) => [...swapBoardKeys.offers(), 'list', query] as const,
  summary: () => [...swapBoardKeys.all, 'summary'] as const,
};

/** A query string from the defined values only. */
export function searchOf(params: Record<string, string | number | boolean | undefined | null>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  const text = search.toString();
  return text ? `?${text}` : '';
}
