import type { StudFinderQuery, StudLoanListQuery, StudOfferListQuery } from '@burrowline/shared';

/**
 * Every Stud Share query lives under ['stud-share']: an offer's change refreshes the buck cards and the
 * finder, a loan's change the loans too (and the buck's availability).
 */
export const studShareKeys = {
  all: ['stud-share'] as const,
  offers: () => [...studShareKeys.all, 'offers'] as const,
  offerList: (query: Partial<StudOfferListQuery>) => [...studShareKeys.offers(), 'list', query] as const,
  offer: (offerId: string) => [...studShareKeys.offers(), 'detail', offerId] as const,
  availability: (offerId: string, from: string, to: string) => [...studShareKeys.offers(), 'availability', offerId, from, to] as const,
  finders: () => [...studShareKeys.all, 'finder'] as const,
  finder: (query: Partial<StudFinderQuery>) => [...studShareKeys.finders(), query] as const,
  loans: () => [...studShareKeys.all, 'loans'] as const,
  loanList: (query: Partial<StudLoanListQuery>) => [...studShareKeys.loans(), 'list', query] as const,
  loan: (loanId: string) => [...studShareKeys.loans(), 'detail', loanId] as const,
};

/** A query string from the defined values only. */
export function searchOf(params: Record<string, string | number | boolean | undefined | null>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  const text = search.toString();
  return text ? `?${text}` : '';
}
