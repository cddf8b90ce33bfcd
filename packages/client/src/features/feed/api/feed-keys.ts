/** The feed book lives under ['feed'] (refreshed on `RealtimeEvent.growOutChanged`). */
export const feedKeys = {
  all: ['feed'] as const,
  book: () => [...feedKeys.all, 'book'] as const,
};
