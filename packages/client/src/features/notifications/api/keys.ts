export const notificationKeys = {
  all: ['notifications'] as const,
  unread: () => [...notificationKeys.all, 'unread'] as const,
  list: (page: number, pageSize: number, unreadOnly: boolean) => [...notificationKeys.all, 'list', { page, pageSize, unreadOnly }] as const,
  preferences: () => [...notificationKeys.all, 'preferences'] as const,
  /** Client-only: the one that just arrived live, for the toast. */
  latest: () => ['notification-latest'] as const,
};
