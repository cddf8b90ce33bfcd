/**
 * Feed conversion: grams of feed per gram of live-weight gain (the same ratio in kg/kg or lb/lb).
 * Lower is better. Feed of animals that died stays in (their feed was spent); their weight does not
 * count as gain, so losses show in the ratio as they do in the feed bill.
 */

export const PUBLISHED_FEED_CONVERSION = Object.freeze({
  growOutPellets: { ratio: 3.8, source: 'NZW post-weaning line study, World Rabbit Science: 3.8 kg feed per kg gain on pellets' },
  growOutForage: { ratio: 4.4, source: 'NZW post-weaning line study, World Rabbit Science: 4.4 kg feed per kg gain on forage' },
  doeAndLitter: { ratio: 5.3, ageDays: 60, source: 'Kellogg, USDA Bureau of Biological Survey, 1933: 5.3 lb feed per lb of live young at 60 days' },
});

function grams(value: number, what: string): number {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`${what} must be 0 or more grams`);
  return value;
}

/** Feed ÷ gain; null when there is no gain to divide by. */
export function feedConversion(feedGrams: number, gainGrams: number): number | null {
  grams(feedGrams, 'Feed');
  if (!Number.isFinite(gainGrams)) throw new RangeError('Gain must be a number of grams');
  return gainGrams > 0 ? feedGrams / gainGrams : null;
}

export interface GroupFeedConversionInput {
  /** Feed given to (or allocated to) the group over the period. */
  feedGrams: number;
  /** The group's total live weight at the start and at the end of the period. */
  startTotalGrams: number;
  endTotalGrams: number;
  /** Live weight of animals taken out alive during the period (sold, kept back, processed early). */
  removedLiveGrams?: number;
}

export interface FeedConversionResult {
  gainGrams: number;
  /** null when the group did not gain. */
  ratio: number | null;
}

/** A grow-out group over a period: gain = end − start + live weight taken out alive. */
export function groupFeedConversion(input: GroupFeedConversionInput): FeedConversionResult {
  const gain = grams(input.endTotalGrams, 'End weight') - grams(input.startTotalGrams, 'Start weight') + grams(input.removedLiveGrams ?? 0, 'Weight taken out');
  return { gainGrams: gain, ratio: feedConversion(input.feedGrams, gain) };
}

export interface DoeLitterFeedConversionInput {
  /** Everything the doe and her litter ate, from the service (or the kindling) to the age measured. */
  feedGrams: number;
  /** Total live weight of her young at that age (weaning, 60 days, or market weight). */
  youngLiveGrams: number;
}

/**
 * Doe + litter: all the feed of the doe and her litter per unit of live young produced (the measure of
 * Kellogg 1933, 5.3 lb feed per lb of young at 60 days). The doe's own weight is not counted.
 */
export function doeLitterFeedConversion(input: DoeLitterFeedConversionInput): FeedConversionResult {
  const young = grams(input.youngLiveGrams, 'Live weight of the young');
  return { gainGrams: young, ratio: feedConversion(input.feedGrams, young) };
}
