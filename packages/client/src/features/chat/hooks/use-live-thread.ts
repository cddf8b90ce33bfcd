import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { ClientEvent, RealtimeEvent, type ChatMessageDto, type ChatPersonDto, type SocketAck } from '@burrowline/shared';
import { isApiError } from '../../../lib/api-client';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { fetchMessages, markThreadRead, sendMessage } from '../api/chat-api';
import { chatKeys } from '../api/keys';

/** A photo uploaded for a message being written (its thumbnail is served to the uploader alone until sent). */
export interface ChatDraftPhoto {
  id: string;
  thumbnailUrl: string;
}

export interface PendingMessage {
  clientId: string;
  body: string;
  photos: ChatDraftPhoto[];
  mentions: ChatPersonDto[];
  replyTo: ChatMessageDto | null;
  status: 'sending' | 'failed';
  error: string | null;
  createdAt: string;
}

const CATCH_UP_PAGE = 200;

function sortedBySeq(map: Map<string, ChatMessageDto>): ChatMessageDto[] {
  return [...map.values()].sort((a, b) => a.seq - b.seq);
}

/**
 * One thread, live and never lost: the latest page, older pages on demand, live messages from the thread's
 * room (joined after the server's read check), and after every reconnect what was missed since the last seq
 * seen. Messages are kept by id, so nothing shows twice. Sends are optimistic with a client id the server
 * treats as the idempotency key, so "retry" never duplicates.
 */
export function useLiveThread(threadId: string, myId: string) {
  const queryClient = useQueryClient();
  const [byId, setById] = useState<Map<string, ChatMessageDto>>(() => new Map());
  const [pending, setPending] = useState<PendingMessage[]>([]);
  const [hasOlder, setHasOlder] = useState(false);
  const [state, setState] = useState<'loading' | 'ready' | 'error'>('loading');
  const [live, setLive] = useState(false);
  const lastSeq = useRef(0);
  const oldestSeq = useRef<number | null>(null);

  const take = useCallback((messages: ChatMessageDto[]) => {
    if (messages.length === 0) return;
    for (const m of messages) {
      lastSeq.current = Math.max(lastSeq.current, m.seq);
      oldestSeq.current = oldestSeq.current === null ? m.seq : Math.min(oldestSeq.current, m.seq);
    }
    setById((previous) => {
      const next = new Map(previous);
      for (const m of messages) {
        const known = next.get(m.id);
        // A live event carries no hidden reason; keep the one the author or admin was shown.
        next.set(m.id, known && m.hiddenReason === null && known.hiddenReason !== null ? { ...m, hiddenReason: known.hiddenReason } : m);
      }
      return next;
    });
    const stored = new Set(messages.filter((m) => m.author.id === myId).map((m) => m.clientId));
    if (stored.size > 0) setPending((list) => list.filter((p) => !stored.has(p.clientId)));
  }, [myId]);

  const catchUp = useCallback(async () => {
    for (let rounds = 0; rounds < 50; rounds++) {
      const page = await fetchMessages(threadId, { after: lastSeq.current, limit: CATCH_UP_PAGE });
      take(page.items);
      if (!page.hasMore) return;
    }
  }, [threadId, take]);

  useEffect(() => {
    let stopped = false;
    let leave = () => {};
    setById(new Map());
    setPending([]);
    setState('loading');
    lastSeq.current = 0;
    oldestSeq.current = null;
    void fetchMessages(threadId, {})
      .then((page) => {
        if (stopped) return;
        take(page.items);
        setHasOlder(page.hasMore);
        setState('ready');
      })
      .catch(() => !stopped && setState('error'));

    void import('../../../lib/socket').then(({ connectRealtime }) => {
      if (stopped) return;
      const socket = connectRealtime();
      const join = () =>
        socket.emit(ClientEvent.chatJoin, { threadId }, (ack: SocketAck) => {
          if (stopped) return;
          setLive(ack.ok);
          // Whatever arrived between the first page and the join (or while the socket was away).
          if (ack.ok) void catchUp().catch(() => undefined);
        });
      const onMessage = (message: ChatMessageDto) => {
        if (message.threadId === threadId) take([message]);
      };
      const onDisconnect = () => setLive(false);
      socket.on(RealtimeEvent.chatMessage, onMessage);
      socket.on('connect', join);
      socket.on('disconnect', onDisconnect);
      if (socket.connected) join();
      leave = () => {
        socket.off(RealtimeEvent.chatMessage, onMessage);
        socket.off('connect', join);
        socket.off('disconnect', onDisconnect);
        if (socket.connected) socket.emit(ClientEvent.chatLeave, { threadId }, () => undefined);
      };
    });
    return () => {
      stopped = true;
      leave();
    };
  }, [threadId, take, catchUp]);

  const loadOlder = useCallback(async () => {
    if (oldestSeq.current === null) return;
    const page = await fetchMessages(threadId, { before: oldestSeq.current });
    take(page.items);
    setHasOlder(page.hasMore);
  }, [threadId, take]);

  const deliver = useCallback(async (message: PendingMessage) => {
    setPending((list) => list.map((p) => (p.clientId === message.clientId ? { ...p, status: 'sending', error: null } : p)));
    try {
      const stored = await sendMessage(threadId, {
        clientId: message.clientId,
        body: message.body,
        replyToId: message.replyTo?.id ?? null,
        mentions: message.mentions.filter((p) => message.body.includes(`@${p.name}`)).map((p) => p.id),
        attachmentIds: message.photos.map((p) => p.id),
      });
      take([stored]);
      void queryClient.invalidateQueries({ queryKey: chatKeys.threads() });
    } catch (error) {
      const text = isApiError(error) ? error.message : 'Not sent: check the connection';
      setPending((list) => list.map((p) => (p.clientId === message.clientId ? { ...p, status: 'failed', error: text } : p)));
    }
  }, [threadId, take, queryClient]);

  const send = useCallback((body: string, mentions: ChatPersonDto[], replyTo: ChatMessageDto | null, photos: ChatDraftPhoto[] = []) => {
    const message: PendingMessage = { clientId: newIdempotencyKey(), body, photos, mentions, replyTo, status: 'sending', error: null, createdAt: new Date().toISOString() };
    setPending((list) => [...list, message]);
    void deliver(message);
  }, [deliver]);

  const retry = useCallback((clientId: string) => {
    const message = pending.find((p) => p.clientId === clientId);
    if (message) void deliver(message);
  }, [pending, deliver]);

  const discard = useCallback((clientId: string) => setPending((list) => list.filter((p) => p.clientId !== clientId)), []);

  const readUpTo = useCallback(async (seq: number) => {
    await markThreadRead(threadId, seq);
    void queryClient.invalidateQueries({ queryKey: chatKeys.threads() });
    void queryClient.invalidateQueries({ queryKey: chatKeys.thread(threadId) });
  }, [threadId, queryClient]);

  return { messages: sortedBySeq(byId), pending, hasOlder, state, live, loadOlder, send, retry, discard, take, readUpTo };
}
