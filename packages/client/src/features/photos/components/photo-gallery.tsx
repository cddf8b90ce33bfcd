import { ImagePlus, Trash2, X } from 'lucide-react';
import { useId, useRef, useState } from 'react';
import type { PhotoDto, PhotoLimitsDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextField } from '../../../components/ui/text-field';
import { useAnimalPhotos } from '../api/get-animal-photos';
import { useDeletePhoto } from '../api/delete-photo';
import { photoKeys } from '../api/photo-keys';
import { useUploadAnimalPhotos } from '../api/upload-animal-photos';

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(bytes < 1024 * 1024 ? 1 : 0)} MB`;
}

/** What is wrong with the chosen files before anything is sent (the server checks again, by content). */
export function photoChoiceProblem(files: File[], limits: PhotoLimitsDto, existing: number): string | null {
  if (files.length === 0) return 'Choose at least one photo.';
  const room = limits.maxPhotos - existing;
  if (files.length > Math.min(room, limits.perUpload)) {
    return room <= 0
      ? `This animal already has ${limits.maxPhotos} photos, the most it may have. Remove one first.`
      : `Choose at most ${Math.min(room, limits.perUpload)} photo${Math.min(room, limits.perUpload) === 1 ? '' : 's'} (an animal may have ${limits.maxPhotos}).`;
  }
  const big = files.find((f) => f.size > limits.maxBytes);
  if (big) return `${big.name} is ${megabytes(big.size)}; a photo may be at most ${megabytes(limits.maxBytes)}.`;
  const odd = files.find((f) => f.type && !limits.types.includes(f.type));
  if (odd) return `${odd.name} is not a JPEG, PNG or WebP photo.`;
  return null;
}

function PhotoViewer({ photo, onClose }: { photo: PhotoDto; onClose: () => void }) {
  return (
    <dialog
      open
      aria-label={photo.caption || 'Photo'}
      className="fixed inset-0 z-50 m-0 flex h-full max-h-none w-full max-w-none items-center justify-center bg-bark/80 p-4"
      onKeyDown={(e) => e.key === 'Escape' && onClose()}
    >
      <figure className="flex max-h-full max-w-4xl flex-col gap-3 rounded-2xl bg-white p-3 shadow-xl">
        <img src={photo.url} alt={photo.caption || 'Photo of the animal'} className="max-h-[75vh] w-auto rounded-lg object-contain" />
        <figcaption className="flex items-center justify-between gap-3 px-1">
          <span className="text-grey-700">{photo.caption || `Uploaded ${photo.uploadedAt.slice(0, 10)}${photo.uploadedBy ? ` by ${photo.uploadedBy.name}` : ''}`}</span>
          <Button variant="secondary" onClick={onClose} autoFocus>
            <X className="size-4" aria-hidden="true" />
            Close
          </Button>
        </figcaption>
      </figure>
    </dialog>
  );
}

/**
 * An animal's photos for its own farm: thumbnails that open full size, and for the owning farm an
 * upload (several at once, within the limits) with a progress bar, and removal.
 */
export function AnimalPhotos({ animalId, name }: { animalId: string; name: string }) {
  const photos = useAnimalPhotos(animalId);
  const upload = useUploadAnimalPhotos(animalId);
  const remove = useDeletePhoto(photoKeys.animal(animalId));
  const [viewing, setViewing] = useState<PhotoDto | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [caption, setCaption] = useState('');
  const input = useRef<HTMLInputElement>(null);
  const inputId = useId();

  if (!photos.data) return photos.isError ? <Alert tone="error">{photos.error.message}</Alert> : <PageSpinner />;
  const { photos: list, canChange, limits } = photos.data;

  const send = (files: File[]) => {
    const wrong = photoChoiceProblem(files, limits, list.length);
    setProblem(wrong);
    if (wrong) return;
    setProgress(0);
    upload.mutate(
      { files, caption, onUpload: (sent, total) => setProgress(total > 0 ? sent / total : null) },
      {
        onSettled: () => {
          setProgress(null);
          if (input.current) input.current.value = '';
        },
        onSuccess: () => setCaption(''),
      },
    );
  };

  return (
    <div className="space-y-4">
      {list.length === 0 ? (
        <p className="text-grey-600">No photos yet.</p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label={`Photos of ${name}`}>
          {list.map((photo, i) => (
            <li key={photo.id} className="space-y-2">
              <button
                type="button"
                onClick={() => setViewing(photo)}
                className="block w-full overflow-hidden rounded-xl border border-grey-200 bg-oat focus-visible:outline-3 focus-visible:outline-moss"
              >
                <img src={photo.thumbnailUrl} alt={photo.caption || `Photo ${i + 1} of ${name}`} className="aspect-square w-full object-cover" loading="lazy" />
                <span className="sr-only">Open full size</span>
              </button>
              {photo.caption && <p className="text-sm text-grey-700">{photo.caption}</p>}
              {canChange &&
                (confirming === photo.id ? (
                  <div className="flex flex-wrap gap-2">
                    <Button variant="danger" isBusy={remove.isPending} onClick={() => remove.mutate(photo.id, { onSettled: () => setConfirming(null) })}>
                      Remove
                    </Button>
                    <Button variant="quiet" onClick={() => setConfirming(null)}>
                      Keep
                    </Button>
                  </div>
                ) : (
                  <Button variant="quiet" className="-ml-2 px-2 whitespace-nowrap" onClick={() => setConfirming(photo.id)}>
                    <Trash2 className="size-4 shrink-0" aria-hidden="true" />
                    Remove<span className="sr-only"> photo {i + 1}</span>
                  </Button>
                ))}
            </li>
          ))}
        </ul>
      )}
      {canChange && (
        <div className="space-y-3 rounded-xl border border-dashed border-grey-300 p-4">
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField label="Caption (optional)" value={caption} maxLength={200} onChange={(e) => setCaption(e.target.value)} />
            <div className="space-y-1.5">
              <label htmlFor={inputId} className="block font-semibold text-bark">
                Add photos
              </label>
              <input
                ref={input}
                id={inputId}
                type="file"
                accept={limits.types.join(',')}
                multiple
                disabled={upload.isPending || list.length >= limits.maxPhotos}
                onChange={(e) => send([...(e.target.files ?? [])])}
                className="block min-h-11 w-full rounded-lg border-2 border-grey-300 bg-white p-2 file:mr-3 file:min-h-9 file:rounded-md file:border-0 file:bg-moss file:px-3 file:font-semibold file:text-white"
              />
            </div>
          </div>
          <p className="flex items-start gap-2 text-sm text-grey-600">
            <ImagePlus className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
            JPEG, PNG or WebP, up to {megabytes(limits.maxBytes)} each, {limits.perUpload} at a time; {list.length} of {limits.maxPhotos} used. Location data in
            phone photos is removed.
          </p>
          {progress !== null && <ProgressBar label="Uploading photos" value={progress} />}
          {problem && <Alert tone="error">{problem}</Alert>}
          {upload.isError && <Alert tone="error">{upload.error.message}</Alert>}
        </div>
      )}
      {viewing && <PhotoViewer photo={viewing} onClose={() => setViewing(null)} />}
    </div>
  );
}
