import type { EntryReviewInput, LitterDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useLitterMutation } from './litter-mutation';

export function reviewLitterEvent(eventId: string, input: EntryReviewInput): Promise<LitterDto> {
  return apiFetch<LitterDto>(`/api/litter-events/${encodeURIComponent(eventId)}/review`, { method: 'POST', body: input });
}

/** The mentor accepts an apprentice's litter count, or returns it (then it no longer counts). */
export function useReviewLitterEvent() {
  return useLitterMutation(({ eventId, input }: { eventId: string; input: EntryReviewInput }) => reviewLitterEvent(eventId, input));
}
