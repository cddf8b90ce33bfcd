import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HerdImportDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { herdKeys } from '../../herd';
import { herdFileKeys } from './herd-file-keys';

export function confirmHerdImport(importId: string, idempotencyKey: string): Promise<HerdImportDto> {
  return apiFetch<HerdImportDto>(`/api/herd-imports/${encodeURIComponent(importId)}/confirmation`, { method: 'POST', body: { idempotencyKey } });
}

/** Confirms a preview with the key made for it: a second click (or a retry) imports nothing twice. */
export function useConfirmHerdImport(importId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (idempotencyKey: string) => confirmHerdImport(importId, idempotencyKey),
    onSettled: () => queryClient.invalidateQueries({ queryKey: herdKeys.all }),
    onSuccess: (done) => queryClient.setQueryData(herdFileKeys.import(importId, { show: 'all', page: 1, pageSize: 100 }), done),
  });
}
