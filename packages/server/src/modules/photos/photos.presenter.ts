import type { PhotoDto } from '@burrowline/shared';
import type { Photo } from './photo.model';

export function presentPhoto(photo: Photo, names: Map<string, string>): PhotoDto {
  return {
    id: photo.id,
    subject: photo.subject,
    animalId: photo.animalId,
    farmId: photo.farmId,
    caption: photo.caption,
    width: photo.width,
    height: photo.height,
    contentType: photo.contentType,
    byteSize: photo.byteSize,
    url: `/api/photos/${photo.id}`,
    thumbnailUrl: `/api/photos/${photo.id}/thumbnail`,
    uploadedAt: photo.createdAt.toISOString(),
    uploadedBy: photo.uploadedBy ? { id: photo.uploadedBy, name: names.get(photo.uploadedBy) ?? 'Someone' } : null,
  };
}
