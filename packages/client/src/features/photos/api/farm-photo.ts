import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { FarmPhotoDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';
import { photoKeys } from './photo-keys';

export function getFarmPhoto(farmId: string, signal?: AbortSignal): Promise<FarmPhotoDto> {
  return apiFetch<FarmPhotoDto>(`/api/farms/${encodeURIComponent(farmId)}/photo`, { signal });
}

export function farmPhotoQueryOptions(farmId: string) {
  return queryOptions({ queryKey: photoKeys.farm(farmId), queryFn: ({ signal }) => getFarmPhoto(farmId, signal) });
}

export function useFarmPhoto(farmId: string) {
  return useQuery(farmPhotoQueryOptions(farmId));
}

export function useReplaceFarmPhoto(farmId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onUpload }: { file: File; onUpload?: (sent: number, total: number) => void }) => {
      const form = new FormData();
      form.append('photo', file);
      return uploadForm<FarmPhotoDto>(`/api/farms/${encodeURIComponent(farmId)}/photo`, form, { method: 'PUT', onUpload });
    },
    onSuccess: (photo) => queryClient.setQueryData(photoKeys.farm(farmId), photo),
  });
}

export function useRemoveFarmPhoto(farmId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<void>(`/api/farms/${encodeURIComponent(farmId)}/photo`, { method: 'DELETE' }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.farm(farmId) }),
  });
}
