import type { FeedBookQuery } from '@burrowline/shared';

/** The feed book lives under ['feed'] (refreshed on `RealtimeEvent.growOutChanged`). */
export const feedKeys = {
  all: ['feed'] as const,
  book: (page: FeedBookQuery) => [...feedKeys.all, 'book', page] as const,
};
