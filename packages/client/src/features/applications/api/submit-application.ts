import { useMutation } from '@tanstack/react-query';
import type { ApplicationInput, ApplicationReceiptDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';

/** The idempotency key in the body makes a retry return the first application instead of a second. */
export function submitApplication(slug: string, input: ApplicationInput): Promise<ApplicationReceiptDto> {
  return apiFetch<ApplicationReceiptDto>(`/api/apply/${encodeURIComponent(slug)}`, { method: 'POST', body: input });
}

export function useSubmitApplication(slug: string) {
  return useMutation({ mutationFn: (input: ApplicationInput) => submitApplication(slug, input) });
}
