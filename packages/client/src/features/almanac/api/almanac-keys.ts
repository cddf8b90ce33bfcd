import type { ServiceListQuery } from '@burrowline/shared';

/**
 * Every Almanac query lives under ['almanac'], so one invalidation (on `almanac:changed`, or after a
 * kindling) refreshes the agenda, Commons' cards, services and settings together.
 */
export const almanacKeys = {
  all: ['almanac'] as const,
  agenda: (range: { from?: string; to?: string; days?: number; include?: 'open' | 'all' }) => [...almanacKeys.all, 'agenda', range] as const,
  summary: () => [...almanacKeys.all, 'summary'] as const,
  settings: () => [...almanacKeys.all, 'settings'] as const,
  breedingStock: () => [...almanacKeys.all, 'breeding-stock'] as const,
  services: (query: ServiceListQuery) => [...almanacKeys.all, 'services', 'list', query] as const,
  service: (serviceId: string) => [...almanacKeys.all, 'services', 'detail', serviceId] as const,
  calendarFeed: () => [...almanacKeys.all, 'calendar-feed'] as const,
  morningEmail: () => [...almanacKeys.all, 'morning-email'] as const,
};
