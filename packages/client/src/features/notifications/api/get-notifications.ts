import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationListDto, NotificationPreferencesDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { notificationKeys } from './keys';

export const unreadQueryOptions = () =>
  queryOptions({ queryKey: notificationKeys.unread(), queryFn: ({ signal }) => apiFetch<{ unread: number }>('/api/notifications/unread', { signal }) });

export const notificationsQueryOptions = (page: number, pageSize: number, unreadOnly: boolean) =>
  queryOptions({
    queryKey: notificationKeys.list(page, pageSize, unreadOnly),
    queryFn: ({ signal }) =>
      apiFetch<NotificationListDto>(`/api/notifications?page=${page}&pageSize=${pageSize}${unreadOnly ? '&unread=true' : ''}`, { signal }),
    placeholderData: keepPreviousData,
  });

export const preferencesQueryOptions = () =>
  queryOptions({ queryKey: notificationKeys.preferences(), queryFn: ({ signal }) => apiFetch<NotificationPreferencesDto>('/api/notifications/preferences', { signal }) });

/** The bell's count; the live event keeps it current, so it is not asked again on every screen. */
export const useUnreadNotifications = () => useQuery({ ...unreadQueryOptions(), staleTime: 5 * 60_000 });
export const useNotifications = (page: number, pageSize: number, unreadOnly: boolean) => useQuery(notificationsQueryOptions(page, pageSize, unreadOnly));
export const useNotificationPreferences = () => useQuery(preferencesQueryOptions());
