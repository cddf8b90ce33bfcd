import type { ApplicationListQuery } from '@burrowline/shared';

/** Every application query lives under ['applications'], so one invalidation (a live event) refreshes them all. */
export const applicationKeys = {
  all: ['applications'] as const,
  list: (query: ApplicationListQuery) => [...applicationKeys.all, 'list', query] as const,
  detail: (applicationId: string) => [...applicationKeys.all, 'detail', applicationId] as const,
  unread: () => [...applicationKeys.all, 'unread'] as const,
  publicCoop: (slug: string) => ['public-coop', slug] as const,
};
