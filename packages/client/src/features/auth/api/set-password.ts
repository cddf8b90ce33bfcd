import { useMutation } from '@tanstack/react-query';
import type { SetPasswordInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';

export function setPassword(input: SetPasswordInput): Promise<{ email: string }> {
  return apiFetch<{ email: string }>('/api/passwords', { method: 'POST', body: input });
}

export function useSetPassword() {
  return useMutation({ mutationFn: setPassword });
}
