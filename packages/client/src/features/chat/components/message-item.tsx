import { useState } from 'react';
import { Ellipsis, Reply, SmilePlus, Pencil, Trash2, EyeOff, RotateCw, X } from 'lucide-react';
import { chatReactionEmoji, chatReactions, CHAT_MESSAGE_MAX, type ChatMessageDto, type ChatReaction } from '@burrowline/shared';
import { isApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { deleteMessage, editMessage, hideMessage, setReaction } from '../api/chat-api';
import type { PendingMessage } from '../hooks/use-live-thread';
import { MessagePhotos } from './message-photos';
import { MessageText } from './message-text';

const time = new Intl.DateTimeFormat(undefined, { hour: 'numeric', minute: '2-digit' });
const iconButton = 'inline-flex size-11 items-center justify-center rounded-lg text-grey-600 hover:bg-grey-100 focus-visible:outline-moss';

function Author({ name, farmName, mine }: { name: string; farmName: string | null; mine: boolean }) {
  return (
    <span className="min-w-0 truncate">
      <span className={cn('font-semibold', mine ? 'text-moss-deep' : 'text-bark')}>{name}</span>
      {farmName && <span className="text-sm text-grey-600"> · {farmName}</span>}
    </span>
  );
}

function Quote({ reply }: { reply: NonNullable<ChatMessageDto['replyTo']> }) {
  return (
    <a href={`#message-${reply.id}`} className="mb-1 block min-h-11 border-l-4 border-grey-300 py-1 pl-2 text-sm text-grey-600 hover:text-bark">
      <span className="font-semibold">{reply.authorName}</span>: {reply.excerpt ?? <em>message removed</em>}
    </a>
  );
}

interface MessageItemProps {
  message: ChatMessageDto;
  myId: string;
  myName: string;
  moderates: boolean;
  firstUnread: boolean;
  onReply: (message: ChatMessageDto) => void;
  onChanged: (message: ChatMessageDto) => void;
}

/** One stored message: author and farm, quoted reply, text, reactions, and what the reader may do with it. */
export function MessageItem({ message, myId, myName, moderates, firstUnread, onReply, onChanged }: MessageItemProps) {
  const mine = message.author.id === myId;
  const [mode, setMode] = useState<'read' | 'edit' | 'hide' | 'react'>('read');
  const [draft, setDraft] = useState(message.body ?? '');
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [actionsOpen, setActionsOpen] = useState(false);

  const act = async (work: () => Promise<ChatMessageDto>) => {
    setBusy(true);
    setError(null);
    try {
      onChanged(await work());
      setMode('read');
      setActionsOpen(false);
    } catch (e) {
      setError(isApiError(e) ? e.message : 'That did not work; try again');
    } finally {
      setBusy(false);
    }
  };
  const toggle = (reaction: ChatReaction) => {
    const on = !message.reactions.find((r) => r.reaction === reaction)?.userIds.includes(myId);
    void act(() => setReaction(message.id, reaction, on));
  };

  return (
    <li id={`message-${message.id}`} className="scroll-mt-24">
      {firstUnread && (
        <div id="first-unread" className="my-2 flex items-center gap-2 text-sm font-semibold text-clay-deep" role="separator">
          <span className="h-px flex-1 bg-clay" /> New messages <span className="h-px flex-1 bg-clay" />
        </div>
      )}
      <article className={cn('group rounded-xl px-3 py-2', message.mentions.some((m) => m.id === myId) && 'bg-straw-wash')} aria-label={`${message.author.name} at ${time.format(new Date(message.createdAt))}`}>
        <header className="flex items-baseline justify-between gap-2">
          <Author name={message.author.name} farmName={message.author.farmName} mine={mine} />
          <span className="flex shrink-0 items-center">
            <time className="text-sm text-grey-600" dateTime={message.createdAt}>
              {time.format(new Date(message.createdAt))}
              {message.editedAt && message.state === 'visible' && <span> · edited</span>}
            </time>
            {message.state === 'visible' && (
              <button type="button" className={cn(iconButton, '-my-2 -mr-2')} aria-expanded={actionsOpen} onClick={() => setActionsOpen((open) => !open)} aria-label={`Actions for ${message.author.name}'s message`}>
                <Ellipsis className="size-5" aria-hidden="true" />
              </button>
            )}
          </span>
        </header>
        {message.replyTo && <Quote reply={message.replyTo} />}
        {message.state === 'deleted' && <p className="text-grey-600 italic">Message removed</p>}
        {message.state === 'hidden' && (
          <p className="text-grey-600 italic">
            Hidden by the co-op's admin{message.hiddenReason ? `: ${message.hiddenReason}` : ''}
          </p>
        )}
        {message.state === 'visible' && mode !== 'edit' && message.body && (
          <p className="break-words whitespace-pre-wrap text-bark">
            <MessageText text={message.body} mentions={message.mentions} myName={myName} />
          </p>
        )}
        {message.state === 'visible' && <MessagePhotos photos={message.attachments} authorName={message.author.name} />}
        {mode === 'edit' && (
          <form
            className="mt-1 space-y-2"
            onSubmit={(e) => {
              e.preventDefault();
              void act(() => editMessage(message.id, { body: draft, mentions: message.mentions.filter((m) => draft.includes(`@${m.name}`)).map((m) => m.id) }));
            }}
          >
            <label className="sr-only" htmlFor={`edit-${message.id}`}>Edit your message</label>
            <textarea id={`edit-${message.id}`} value={draft} maxLength={CHAT_MESSAGE_MAX} onChange={(e) => setDraft(e.target.value)} rows={3} className="w-full rounded-lg border border-grey-300 p-2" />
            <div className="flex gap-2">
              <button type="submit" disabled={busy} className="min-h-11 rounded-lg bg-moss px-4 font-semibold text-white">Save</button>
              <button type="button" onClick={() => setMode('read')} className="min-h-11 rounded-lg px-4 font-semibold text-moss-deep">Cancel</button>
            </div>
          </form>
        )}
        {mode === 'hide' && (
          <form
            className="mt-1 space-y-2"
            onSubmit={(e) => {
              e.preventDefault();
              void act(() => hideMessage(message.id, reason));
            }}
          >
            <label className="block text-sm font-semibold" htmlFor={`hide-${message.id}`}>Why hide it? The author is told; the text is kept for the audit.</label>
            <input id={`hide-${message.id}`} value={reason} onChange={(e) => setReason(e.target.value)} className="min-h-11 w-full rounded-lg border border-grey-300 px-2" />
            <div className="flex gap-2">
              <button type="submit" disabled={busy} className="min-h-11 rounded-lg bg-clay px-4 font-semibold text-white">Hide message</button>
              <button type="button" onClick={() => setMode('read')} className="min-h-11 rounded-lg px-4 font-semibold text-moss-deep">Cancel</button>
            </div>
          </form>
        )}
        {message.reactions.length > 0 && (
          <ul className="mt-1 flex flex-wrap gap-1" aria-label="Reactions">
            {message.reactions.map((r) => (
              <li key={r.reaction}>
                <button
                  type="button"
                  onClick={() => toggle(r.reaction)}
                  aria-pressed={r.userIds.includes(myId)}
                  className={cn('inline-flex min-h-11 min-w-11 items-center justify-center gap-1 rounded-full border px-2 text-sm', r.userIds.includes(myId) ? 'border-moss bg-moss-wash' : 'border-grey-200 bg-white')}
                >
                  <span aria-hidden="true">{chatReactionEmoji[r.reaction]}</span>
                  <span>{r.userIds.length}</span>
                  <span className="sr-only">{r.reaction}</span>
                </button>
              </li>
            ))}
          </ul>
        )}
        {mode === 'react' && (
          <div className="mt-1 flex flex-wrap gap-1" role="group" aria-label="Choose a reaction">
            {chatReactions.map((reaction) => (
              <button key={reaction} type="button" onClick={() => toggle(reaction)} className="inline-flex size-11 items-center justify-center rounded-full border border-grey-200 bg-white text-xl" aria-label={reaction}>
                {chatReactionEmoji[reaction]}
              </button>
            ))}
          </div>
        )}
        {error && <p role="alert" className="mt-1 text-sm text-clay-deep">{error}</p>}
        {message.state === 'visible' && mode === 'read' && actionsOpen && (
          <div className="mt-1 flex flex-wrap gap-0.5">
            <button type="button" className={iconButton} onClick={() => { setActionsOpen(false); onReply(message); }} aria-label={`Reply to ${message.author.name}`}><Reply className="size-5" aria-hidden="true" /></button>
            <button type="button" className={iconButton} onClick={() => setMode('react')} aria-label="React"><SmilePlus className="size-5" aria-hidden="true" /></button>
            {mine && (
              <>
                <button type="button" className={iconButton} onClick={() => { setDraft(message.body ?? ''); setMode('edit'); }} aria-label="Edit your message"><Pencil className="size-5" aria-hidden="true" /></button>
                <button type="button" className={iconButton} disabled={busy} onClick={() => { if (window.confirm('Remove this message? A "message removed" note stays in its place.')) void act(() => deleteMessage(message.id)); }} aria-label="Remove your message"><Trash2 className="size-5" aria-hidden="true" /></button>
              </>
            )}
            {moderates && !mine && (
              <button type="button" className={iconButton} onClick={() => setMode('hide')} aria-label="Hide this message"><EyeOff className="size-5" aria-hidden="true" /></button>
            )}
          </div>
        )}
        {mode === 'react' && (
          <button type="button" className={iconButton} onClick={() => setMode('read')} aria-label="Close reactions"><X className="size-5" aria-hidden="true" /></button>
        )}
      </article>
    </li>
  );
}

/** A message on its way: shown at once, marked while sending, with a retry if it failed. */
export function PendingItem({ message, myName, onRetry, onDiscard }: { message: PendingMessage; myName: string; onRetry: () => void; onDiscard: () => void }) {
  return (
    <li>
      <article className={cn('rounded-xl px-3 py-2', message.status === 'failed' ? 'bg-clay-wash' : 'opacity-70')} aria-label="Your message, not yet confirmed">
        <header className="flex items-baseline justify-between gap-2">
          <span className="font-semibold text-moss-deep">{myName}</span>
          <span className="text-sm text-grey-600">{message.status === 'sending' ? 'Sending…' : 'Not sent'}</span>
        </header>
        {message.replyTo && <Quote reply={{ id: message.replyTo.id, authorName: message.replyTo.author.name, excerpt: message.replyTo.body }} />}
        {message.body && <p className="break-words whitespace-pre-wrap text-bark"><MessageText text={message.body} mentions={message.mentions} myName={myName} /></p>}
        {message.photos.length > 0 && (
          <ul className="mt-1 flex flex-wrap gap-2" aria-label="Photos">
            {message.photos.map((photo) => (
              <li key={photo.id}><img src={photo.thumbnailUrl} alt="" className="size-32 rounded-lg border border-grey-200 object-cover sm:size-40" /></li>
            ))}
          </ul>
        )}
        {message.status === 'failed' && (
          <div className="mt-1 flex flex-wrap items-center gap-2">
            <p role="alert" className="text-sm text-clay-deep">{message.error}</p>
            <button type="button" onClick={onRetry} className="inline-flex min-h-11 items-center gap-1 rounded-lg bg-moss px-3 font-semibold text-white"><RotateCw className="size-4" aria-hidden="true" />Retry</button>
            <button type="button" onClick={onDiscard} className="min-h-11 rounded-lg px-3 font-semibold text-moss-deep">Discard</button>
          </div>
        )}
      </article>
    </li>
  );
}
