import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CalendarFeedDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function getCalendarFeed(signal?: AbortSignal): Promise<CalendarFeedDto> {
  return apiFetch<CalendarFeedDto>('/api/almanac/calendar-feed', { signal });
}

export function calendarFeedQueryOptions() {
  return queryOptions({ queryKey: almanacKeys.calendarFeed(), queryFn: ({ signal }) => getCalendarFeed(signal) });
}

/** Whether the farm's feed is on (members only; its secret address is shown once, when made). */
export function useCalendarFeed(enabled: boolean) {
  return useQuery({ ...calendarFeedQueryOptions(), enabled });
}
