import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DigestPreferenceDto, DigestPreferenceInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function updateMorningEmail(input: DigestPreferenceInput): Promise<DigestPreferenceDto> {
  return apiFetch<DigestPreferenceDto>('/api/almanac/morning-email', { method: 'PUT', body: input });
}

export function useUpdateMorningEmail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMorningEmail,
    onSuccess: (pref) => queryClient.setQueryData(almanacKeys.morningEmail(), pref),
  });
}
