import type { LitterListQuery } from '@burrowline/shared';

/** Every litter query lives under ['litters'] (refreshed on `litter:changed`). */
export const litterKeys = {
  all: ['litters'] as const,
  list: (query: LitterListQuery) => [...litterKeys.all, 'list', query] as const,
  detail: (litterId: string) => [...litterKeys.all, 'detail', litterId] as const,
  fosterCandidates: (litterId: string) => [...litterKeys.all, 'foster-candidates', litterId] as const,
};
