import type { SwapListingKind, SwapListingState, SwapOfferState, SwapPriceMode, SwapWeightBand } from '@burrowline/shared';

export const kindLabels: Record<SwapListingKind, string> = { breeding_stock: 'Breeding stock', grow_out: 'Grow-out', wanted: 'Wanted' };
export const listingStateLabels: Record<SwapListingState, string> = {
  draft: 'Draft', open: 'Open', under_offer: 'Under offer', sold: 'Sold', withdrawn: 'Withdrawn', expired: 'Expired',
};
export const offerStateLabels: Record<SwapOfferState, string> = {
  open: 'Open', accepted: 'Accepted, awaiting collection', collected: 'Collected', failed: 'Hand-over failed', declined: 'Declined', withdrawn: 'Withdrawn', expired: 'Expired',
};
export const priceModeLabels: Record<SwapPriceMode, string> = { price: 'Price', trade: 'Trade', offers: 'Offers' };
export const bandLabels: Record<SwapWeightBand, string> = {
  below: 'below the breed\'s senior band', within: 'within the breed\'s senior band', above: 'above the breed\'s senior band',
  growing: 'still growing', no_standard: 'no breed standard',
};

/** Age in words a buyer reads at a glance: weeks for kits, months after. */
export function ageText(days: number | null): string {
  if (days === null) return 'Age unknown';
  if (days < 70) return `${Math.floor(days / 7)} weeks`;
  const months = Math.floor(days / 30.44);
  return months < 24 ? `${months} months` : `${Math.floor(months / 12)} years ${months % 12} mo`;
}
