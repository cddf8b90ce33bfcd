import { useRef, useState } from 'react';
import { ImagePlus, SendHorizontal, X } from 'lucide-react';
import { CHAT_ATTACHMENTS_MAX, CHAT_MESSAGE_MAX, type ChatMessageDto, type ChatPersonDto } from '@burrowline/shared';
import { isApiError } from '../../../lib/api-client';
import { shareChatPhotos, useMentionCandidates } from '../api/chat-api';
import type { ChatDraftPhoto } from '../hooks/use-live-thread';

const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'];

/** The "@word" being typed just before the caret, if any. */
function mentionQuery(text: string, caret: number): { start: number; query: string } | null {
  const before = text.slice(0, caret);
  const match = /(^|\s)@([\p{L}\p{N}'’-]{0,30}(?: [\p{L}\p{N}'’-]{0,30})?)$/u.exec(before);
  if (!match) return null;
  return { start: caret - match[2]!.length - 1, query: match[2]! };
}

interface ComposerProps {
  threadId: string;
  replyTo: ChatMessageDto | null;
  onCancelReply: () => void;
  onSend: (body: string, mentions: ChatPersonDto[], photos: ChatDraftPhoto[]) => void;
  /** Sticks above the phone's bottom bar on a full page; embedded on another page it stays in its box. */
  sticky: boolean;
}

/**
 * Writes a message: Enter sends, Shift+Enter starts a new line; "@" offers the people who may read the
 * thread. It sticks to the bottom of the screen on a phone, above the bottom bar, so the on-screen keyboard
 * pushes it up with the page.
 */
export function Composer({ threadId, replyTo, onCancelReply, onSend, sticky }: ComposerProps) {
  const [text, setText] = useState('');
  const [mentions, setMentions] = useState<ChatPersonDto[]>([]);
  const [typing, setTyping] = useState<{ start: number; query: string } | null>(null);
  const [photos, setPhotos] = useState<ChatDraftPhoto[]>([]);
  const [uploading, setUploading] = useState<number | null>(null);
  const [photoError, setPhotoError] = useState<string | null>(null);
  const area = useRef<HTMLTextAreaElement>(null);
  const picker = useRef<HTMLInputElement>(null);
  const candidates = useMentionCandidates(threadId, typing ? typing.query : null);
  const people = typing ? (candidates.data ?? []) : [];

  const pick = (person: ChatPersonDto) => {
    if (!typing) return;
    const caret = area.current?.selectionStart ?? text.length;
    const next = `${text.slice(0, typing.start)}@${person.name} ${text.slice(caret)}`;
    setText(next);
    setMentions((list) => (list.some((p) => p.id === person.id) ? list : [...list, person]));
    setTyping(null);
    requestAnimationFrame(() => {
      const at = typing.start + person.name.length + 2;
      area.current?.focus();
      area.current?.setSelectionRange(at, at);
    });
  };

  const attach = async (chosen: File[]) => {
    setPhotoError(null);
    const room = CHAT_ATTACHMENTS_MAX - photos.length;
    if (chosen.length > room) return setPhotoError(`A message carries at most ${CHAT_ATTACHMENTS_MAX} photos.`);
    const odd = chosen.find((f) => f.type && !PHOTO_TYPES.includes(f.type));
    if (odd) return setPhotoError(`${odd.name} is not a JPEG, PNG or WebP photo.`);
    setUploading(0);
    try {
      const { photos: stored } = await shareChatPhotos(threadId, chosen, (sent, total) => setUploading(total > 0 ? Math.round((sent / total) * 100) : 0));
      setPhotos((list) => [...list, ...stored.map((p) => ({ id: p.id, thumbnailUrl: p.thumbnailUrl }))]);
    } catch (e) {
      setPhotoError(isApiError(e) ? e.message : 'The photo was not sent: check the connection');
    } finally {
      setUploading(null);
    }
  };

  const submit = () => {
    const body = text.trim();
    if ((!body && photos.length === 0) || body.length > CHAT_MESSAGE_MAX || uploading !== null) return;
    onSend(body, mentions.filter((p) => body.includes(`@${p.name}`)), photos);
    setText('');
    setMentions([]);
    setTyping(null);
    setPhotos([]);
  };

  return (
    <div className={sticky ? 'sticky bottom-[calc(57px+env(safe-area-inset-bottom))] z-10 lg:bottom-0' : ''}>
      <form
        className="border-t border-grey-200 bg-white p-2"
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        {replyTo && (
          <div className="mb-2 flex items-center justify-between gap-2 rounded-lg bg-grey-100 px-3 py-1 text-sm">
            <span className="min-w-0 truncate">
              Replying to <strong>{replyTo.author.name}</strong>: {replyTo.body}
            </span>
            <button type="button" onClick={onCancelReply} className="inline-flex size-11 shrink-0 items-center justify-center rounded-lg" aria-label="Cancel the reply">
              <X className="size-5" aria-hidden="true" />
            </button>
          </div>
        )}
        {people.length > 0 && (
          <ul className="mb-2 max-h-56 overflow-y-auto rounded-lg border border-grey-200 bg-white shadow" role="listbox" aria-label="People to mention">
            {people.map((person) => (
              <li key={person.id} role="option" aria-selected="false">
                <button type="button" onClick={() => pick(person)} className="flex min-h-11 w-full items-center gap-2 px-3 text-left hover:bg-moss-wash">
                  <span className="font-semibold">{person.name}</span>
                  {person.farmName && <span className="truncate text-sm text-grey-600">{person.farmName}</span>}
                </button>
              </li>
            ))}
          </ul>
        )}
        {(photos.length > 0 || uploading !== null) && (
          <ul className="mb-2 flex flex-wrap gap-2" aria-label="Photos to send">
            {photos.map((photo, i) => (
              <li key={photo.id} className="relative">
                <img src={photo.thumbnailUrl} alt={`Photo ${i + 1} to send`} className="size-16 rounded-lg border border-grey-200 object-cover" />
                <button type="button" onClick={() => setPhotos((list) => list.filter((p) => p.id !== photo.id))} className="absolute -top-2 -right-2 inline-flex size-8 items-center justify-center rounded-full bg-bark text-white" aria-label={`Leave out photo ${i + 1}`}>
                  <X className="size-4" aria-hidden="true" />
                </button>
              </li>
            ))}
            {uploading !== null && <li className="flex size-16 items-center justify-center rounded-lg bg-grey-100 text-sm text-grey-700" role="status">{uploading}%</li>}
          </ul>
        )}
        {photoError && <p role="alert" className="mb-2 text-sm text-clay-deep">{photoError}</p>}
        <div className="flex items-end gap-2">
          <input
            ref={picker}
            type="file"
            accept={PHOTO_TYPES.join(',')}
            multiple
            className="sr-only"
            tabIndex={-1}
            // The "Attach a photo" button opens it; screen readers use that button.
            aria-hidden="true"
            onChange={(e) => {
              const files = [...(e.target.files ?? [])];
              e.target.value = '';
              if (files.length > 0) void attach(files);
            }}
          />
          <button
            type="button"
            onClick={() => picker.current?.click()}
            disabled={uploading !== null || photos.length >= CHAT_ATTACHMENTS_MAX}
            className="inline-flex size-11 shrink-0 items-center justify-center rounded-lg border border-grey-300 text-moss-deep disabled:opacity-50"
            aria-label="Attach a photo"
          >
            <ImagePlus className="size-5" aria-hidden="true" />
          </button>
          <label htmlFor={`composer-${threadId}`} className="sr-only">Write a message</label>
          <textarea
            id={`composer-${threadId}`}
            ref={area}
            value={text}
            rows={1}
            maxLength={CHAT_MESSAGE_MAX}
            placeholder="Write a message… (@ to mention)"
            onChange={(e) => {
              setText(e.target.value);
              setTyping(mentionQuery(e.target.value, e.target.selectionStart));
            }}
            onKeyDown={(e) => {
              if (e.key === 'Enter' && !e.shiftKey && !e.nativeEvent.isComposing) {
                e.preventDefault();
                submit();
              }
              if (e.key === 'Escape') setTyping(null);
            }}
            className="max-h-40 min-h-11 min-w-0 flex-1 resize-none rounded-lg border border-grey-300 px-3 py-2 text-base [field-sizing:content]"
          />
          <button type="submit" disabled={(text.trim().length === 0 && photos.length === 0) || uploading !== null} className="inline-flex size-11 shrink-0 items-center justify-center rounded-lg bg-moss text-white disabled:opacity-50" aria-label="Send">
            <SendHorizontal className="size-5" aria-hidden="true" />
          </button>
        </div>
        {text.length > CHAT_MESSAGE_MAX - 300 && (
          <p className="mt-1 text-right text-sm text-grey-600">{text.length.toLocaleString()} / {CHAT_MESSAGE_MAX.toLocaleString()}</p>
        )}
      </form>
    </div>
  );
}
