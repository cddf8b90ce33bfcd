import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';

export function deletePhoto(photoId: string): Promise<void> {
  return apiFetch<void>(`/api/photos/${encodeURIComponent(photoId)}`, { method: 'DELETE' });
}

/** Removes a photo, then refreshes the gallery it was in (`queryKey`). */
export function useDeletePhoto(queryKey: readonly unknown[]) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePhoto,
    onSuccess: () => queryClient.invalidateQueries({ queryKey }),
  });
}
