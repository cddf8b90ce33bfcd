import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PhotoDto } from '@burrowline/shared';
import { uploadForm } from '../../../lib/upload';
import { photoKeys } from './photo-keys';

export interface PhotoUpload {
  files: File[];
  caption: string;
  onUpload?: (sent: number, total: number) => void;
}

export function uploadAnimalPhotos(animalId: string, { files, caption, onUpload }: PhotoUpload): Promise<{ photos: PhotoDto[] }> {
  const form = new FormData();
  form.append('caption', caption);
  for (const file of files) form.append('photos', file);
  return uploadForm<{ photos: PhotoDto[] }>(`/api/animals/${encodeURIComponent(animalId)}/photos`, form, { onUpload });
}

export function useUploadAnimalPhotos(animalId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (upload: PhotoUpload) => uploadAnimalPhotos(animalId, upload),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.animal(animalId) }),
  });
}
