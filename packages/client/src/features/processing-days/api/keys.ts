/** Every Processing Days query lives under ['processing-days'] (refreshed on `RealtimeEvent.processingDayChanged`). */
export const processingDayKeys = {
  all: ['processing-days'] as const,
  list: (when: 'upcoming' | 'past') => [...processingDayKeys.all, 'list', when] as const,
  detail: (dayId: string) => [...processingDayKeys.all, 'day', dayId] as const,
  bookings: (dayId: string) => [...processingDayKeys.all, 'day', dayId, 'bookings'] as const,
  candidates: (dayId: string, farmId: string) => [...processingDayKeys.all, 'day', dayId, 'candidates', farmId] as const,
  summary: (dayId: string) => [...processingDayKeys.all, 'day', dayId, 'summary'] as const,
  sites: () => [...processingDayKeys.all, 'sites'] as const,
};
