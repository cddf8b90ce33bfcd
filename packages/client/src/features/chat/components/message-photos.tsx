import { useState } from 'react';
import { X } from 'lucide-react';
import type { ChatAttachmentDto } from '@burrowline/shared';

/** A photo full size over the page; Escape, the button or a tap outside the picture closes it. */
function PhotoViewer({ photo, authorName, onClose }: { photo: ChatAttachmentDto; authorName: string; onClose: () => void }) {
  return (
    <dialog
      open
      aria-label={`Photo from ${authorName}`}
      className="fixed inset-0 z-50 m-0 flex h-full max-h-none w-full max-w-none items-center justify-center bg-bark/80 p-3"
      onKeyDown={(e) => e.key === 'Escape' && onClose()}
      onClick={(e) => e.target === e.currentTarget && onClose()}
    >
      <figure className="flex max-h-full max-w-4xl flex-col gap-2 rounded-2xl bg-white p-2 shadow-xl">
        <img src={photo.url} alt={`Photo from ${authorName}`} width={photo.width} height={photo.height} className="max-h-[80vh] w-auto rounded-lg object-contain" />
        <figcaption className="flex justify-end">
          <button type="button" onClick={onClose} autoFocus className="inline-flex min-h-11 items-center gap-1 rounded-lg border border-grey-300 px-4 font-semibold text-moss-deep">
            <X className="size-4" aria-hidden="true" /> Close
          </button>
        </figcaption>
      </figure>
    </dialog>
  );
}

/** A message's photos as thumbnails (served only to the thread's readers); a tap opens one full size. */
export function MessagePhotos({ photos, authorName }: { photos: ChatAttachmentDto[]; authorName: string }) {
  const [open, setOpen] = useState<ChatAttachmentDto | null>(null);
  if (photos.length === 0) return null;
  return (
    <>
      <ul className="mt-1 flex flex-wrap gap-2" aria-label="Photos">
        {photos.map((photo, i) => (
          <li key={photo.id}>
            <button type="button" onClick={() => setOpen(photo)} className="block overflow-hidden rounded-lg border border-grey-200 focus-visible:outline-moss" aria-label={`Open photo ${i + 1} from ${authorName}`}>
              <img src={photo.thumbnailUrl} alt="" loading="lazy" width={160} height={160} className="size-32 object-cover sm:size-40" />
            </button>
          </li>
        ))}
      </ul>
      {open && <PhotoViewer photo={open} authorName={authorName} onClose={() => setOpen(null)} />}
    </>
  );
}
