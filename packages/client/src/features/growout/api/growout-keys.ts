/** Every grow-out query lives under ['growout'] (refreshed on `growout:changed`). */
export const growOutKeys = {
  all: ['growout'] as const,
  list: (filters: { status: 'growing' | 'closed' | 'all'; readyBy?: string }) => [...growOutKeys.all, 'list', filters] as const,
  detail: (groupId: string) => [...growOutKeys.all, 'detail', groupId] as const,
  litterChoices: () => [...growOutKeys.all, 'litter-choices'] as const,
};
