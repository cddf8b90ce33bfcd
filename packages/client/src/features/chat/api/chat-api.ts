import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  ChatMessageDto, ChatMessageInput, ChatMessagePageDto, ChatMuteDto, ChatMuteInput, ChatPersonDto, ChatReaction, ChatSearchHitDto,
  ChatThreadDto, ChatThreadListDto,
} from '@burrowline/shared';
import type { PhotoDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';
import { chatKeys } from './keys';

const enc = encodeURIComponent;

export const chatThreadsQueryOptions = () =>
  queryOptions({ queryKey: chatKeys.threads(), queryFn: ({ signal }) => apiFetch<ChatThreadListDto>('/api/chat/threads', { signal }) });

/** The person's threads with unread counts; live activity invalidates it. */
export const useChatThreads = () => useQuery(chatThreadsQueryOptions());

/** The total of unread messages, for the navigation and the hub. */
export function useChatUnread(): number {
  return useChatThreads().data?.totalUnread ?? 0;
}

/** Unread messages in a subject's thread (a processing day's card, a loan's row); 0 before anyone wrote. */
export function useSubjectUnread(subjectType: string, subjectId: string): number {
  return useChatThreads().data?.items.find((t) => t.subjectType === subjectType && t.subjectId === subjectId)?.unread ?? 0;
}

export const chatThreadQueryOptions = (threadId: string) =>
  queryOptions({ queryKey: chatKeys.thread(threadId), queryFn: ({ signal }) => apiFetch<ChatThreadDto>(`/api/chat/threads/${enc(threadId)}`, { signal }) });

export const useChatThread = (threadId: string | null) => useQuery({ ...chatThreadQueryOptions(threadId ?? ''), enabled: threadId !== null });

/** A subject's thread, made on the server the first time it is opened (hence a POST). */
export const useSubjectThread = (subjectType: string, subjectId: string) =>
  useQuery({
    queryKey: chatKeys.subject(subjectType, subjectId),
    queryFn: ({ signal }) => apiFetch<ChatThreadDto>(`/api/chat/subjects/${enc(subjectType)}/${enc(subjectId)}/open`, { method: 'POST', signal }),
    staleTime: 60_000,
  });

export function fetchMessages(threadId: string, params: { before?: number; after?: number; limit?: number }, signal?: AbortSignal) {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined) search.set(key, String(value));
  const query = search.toString();
  return apiFetch<ChatMessagePageDto>(`/api/chat/threads/${enc(threadId)}/messages${query ? `?${query}` : ''}`, { signal });
}

export const sendMessage = (threadId: string, body: ChatMessageInput) =>
  apiFetch<ChatMessageDto>(`/api/chat/threads/${enc(threadId)}/messages`, { method: 'POST', body });

/** Uploads photos for the message being written; the message names them by id when it is sent. */
export function shareChatPhotos(threadId: string, files: File[], onUpload?: (sent: number, total: number) => void) {
  const form = new FormData();
  for (const file of files) form.append('photos', file);
  return uploadForm<{ photos: PhotoDto[] }>(`/api/chat/threads/${enc(threadId)}/attachments`, form, { onUpload });
}

export const markThreadRead = (threadId: string, seq: number) =>
  apiFetch<ChatThreadDto>(`/api/chat/threads/${enc(threadId)}/read`, { method: 'POST', body: { seq } });

export const editMessage = (messageId: string, body: { body: string; mentions: string[] }) =>
  apiFetch<ChatMessageDto>(`/api/chat/messages/${enc(messageId)}`, { method: 'PATCH', body });

export const deleteMessage = (messageId: string) => apiFetch<ChatMessageDto>(`/api/chat/messages/${enc(messageId)}`, { method: 'DELETE' });

export const hideMessage = (messageId: string, reason: string) =>
  apiFetch<ChatMessageDto>(`/api/chat/messages/${enc(messageId)}/hide`, { method: 'POST', body: { reason } });

export const setReaction = (messageId: string, reaction: ChatReaction, on: boolean) =>
  apiFetch<ChatMessageDto>(`/api/chat/messages/${enc(messageId)}/reactions/${enc(reaction)}`, { method: on ? 'PUT' : 'DELETE' });

export const fetchPeople = (threadId: string, search: string, signal?: AbortSignal) =>
  apiFetch<ChatPersonDto[]>(`/api/chat/threads/${enc(threadId)}/people?q=${enc(search)}`, { signal });

export const useMentionCandidates = (threadId: string, search: string | null) =>
  useQuery({
    queryKey: chatKeys.people(threadId, search ?? ''),
    queryFn: ({ signal }) => fetchPeople(threadId, search ?? '', signal),
    enabled: search !== null,
    staleTime: 60_000,
  });

export const useChatSearch = (q: string) =>
  useQuery({
    queryKey: chatKeys.search(q),
    queryFn: ({ signal }) => apiFetch<ChatSearchHitDto[]>(`/api/chat/search?q=${enc(q)}`, { signal }),
    enabled: q.trim().length >= 2,
  });

export function useStartTopic() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (title: string) => apiFetch<ChatThreadDto>('/api/chat/threads', { method: 'POST', body: { title } }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: chatKeys.threads() }),
  });
}

export const useMutes = (enabled: boolean) =>
  useQuery({ queryKey: chatKeys.mutes(), queryFn: ({ signal }) => apiFetch<ChatMuteDto[]>('/api/chat/mutes', { signal }), enabled });

export function useMutePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChatMuteInput) => apiFetch<ChatMuteDto>('/api/chat/mutes', { method: 'POST', body: input }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: chatKeys.mutes() }),
  });
}

export function useLiftMute() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => apiFetch<{ lifted: number }>(`/api/chat/mutes/${enc(userId)}`, { method: 'DELETE' }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: chatKeys.mutes() }),
  });
}
