import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NotificationDto, NotificationPreferencesDto, NotificationPreferencesInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { notificationKeys } from './keys';

function useNotificationMutation<TBody, TResult>(send: (body: TBody) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: send, onSuccess: () => void queryClient.invalidateQueries({ queryKey: notificationKeys.all }) });
}

export const useMarkRead = () => useNotificationMutation((id: string) => apiFetch<NotificationDto>(`/api/notifications/${encodeURIComponent(id)}/read`, { method: 'POST' }));
export const useMarkAllRead = () => useNotificationMutation(() => apiFetch<{ unread: number; marked: number }>('/api/notifications/read', { method: 'POST' }));
export const useSetNotificationPreferences = () =>
  useNotificationMutation((body: NotificationPreferencesInput) => apiFetch<NotificationPreferencesDto>('/api/notifications/preferences', { method: 'PUT', body }));
