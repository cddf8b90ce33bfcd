/** Every litter query lives under ['litters'] (refreshed on `litter:changed`). */
export const litterKeys = {
  all: ['litters'] as const,
  list: (filters: { status?: 'nursing' | 'weaned' | 'all' }) => [...litterKeys.all, 'list', filters] as const,
  detail: (litterId: string) => [...litterKeys.all, 'detail', litterId] as const,
  fosterCandidates: (litterId: string) => [...litterKeys.all, 'foster-candidates', litterId] as const,
};
