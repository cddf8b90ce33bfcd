import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeDto, SignInInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { meKey } from './get-me';

export function signIn(input: SignInInput): Promise<MeDto> {
  return apiFetch<MeDto>('/api/session', { method: 'POST', body: input });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => {
      // Nothing cached for a previous person may leak into this session.
      queryClient.removeQueries();
      queryClient.setQueryData(meKey, me);
    },
  });
}
