/** Every grow-out query lives under ['grow-out'] (refreshed on `RealtimeEvent.growOutChanged`). */
export const growOutKeys = {
  all: ['grow-out'] as const,
  list: (filters: { status: 'growing' | 'closed' | 'all'; readyBy?: string }) => [...growOutKeys.all, 'list', filters] as const,
  detail: (groupId: string) => [...growOutKeys.all, 'detail', groupId] as const,
  litterChoices: () => [...growOutKeys.all, 'litter-choices'] as const,
};
