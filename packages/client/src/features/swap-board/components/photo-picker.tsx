import { useQueries } from '@tanstack/react-query';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { animalPhotosQueryOptions } from '../../photos';

/** The farm's photos of these animals, as the picker shows them. */
export function useAnimalsPhotos(animalIds: string[]) {
  const results = useQueries({ queries: animalIds.map((id) => animalPhotosQueryOptions(id)) });
  return { photos: results.flatMap((r) => r.data?.photos ?? []), reading: results.some((r) => r.isPending) };
}

/** Pick which of the listed animals' photos the listing shows (the server takes the farm's own photos of them only). */
export function PhotoPicker({ animalIds, field, error }: { animalIds: string[]; field: UseFormRegisterReturn; error?: string }) {
  const { photos, reading } = useAnimalsPhotos(animalIds);
  return (
    <fieldset className="space-y-2">
      <legend className="font-medium">Photos to show (up to 6)</legend>
      {photos.length > 0 ? (
        <ul className="grid grid-cols-3 gap-3 sm:grid-cols-4 lg:grid-cols-6" aria-label="Photos to show">
          {photos.map((p, i) => (
            <li key={p.id}>
              <label className="block cursor-pointer space-y-1">
                <img src={p.thumbnailUrl} alt={p.caption || `Photo ${i + 1}`} className="aspect-square w-full rounded-lg object-cover" loading="lazy" />
                <span className="flex min-h-11 items-center gap-2">
                  <input type="checkbox" value={p.id} className="size-6 accent-moss" {...field} />
                  Show
                </span>
              </label>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-grey-600">
          {animalIds.length === 0 ? 'Choose the animals to pick their photos.' : reading ? 'Reading their photos…' : 'No photos of them yet; add them on their Herd pages.'}
        </p>
      )}
      {error && <p className="text-sm font-medium text-clay-deep">{error}</p>}
    </fieldset>
  );
}
