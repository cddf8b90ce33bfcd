/** Every farm query lives under ['farms'], so one invalidation (e.g. on `farm:updated`) refreshes them all. */
export const farmKeys = {
  all: ['farms'] as const,
  list: () => [...farmKeys.all, 'list'] as const,
  detail: (farmId: string) => [...farmKeys.all, 'detail', farmId] as const,
};
