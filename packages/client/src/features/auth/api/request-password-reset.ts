import { useMutation } from '@tanstack/react-query';
import type { PasswordResetRequestInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';

/** The server answers the same whether or not the address has an account. */
export function requestPasswordReset(input: PasswordResetRequestInput): Promise<{ message: string }> {
  return apiFetch<{ message: string }>('/api/password-resets', { method: 'POST', body: input });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
