import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

/** Makes the feed's secret address, or a new one (the old address stops working). */
export function renewCalendarFeed(): Promise<CalendarFeedDto> {
  return apiFetch<CalendarFeedDto>('/api/almanac/calendar-feed', { method: 'POST' });
}

export function revokeCalendarFeed(): Promise<void> {
  return apiFetch<void>('/api/almanac/calendar-feed', { method: 'DELETE' });
}

export function useRenewCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: renewCalendarFeed,
    onSuccess: (feed) => queryClient.setQueryData(almanacKeys.calendarFeed(), { ...feed, url: null }),
  });
}

export function useRevokeCalendarFeed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeCalendarFeed,
    onSuccess: () => queryClient.setQueryData(almanacKeys.calendarFeed(), { active: false, createdAt: null, url: null }),
  });
}
