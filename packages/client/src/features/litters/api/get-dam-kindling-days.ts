import { useQuery } from '@tanstack/react-query';
import { littersQueryOptions } from './get-litters';

/**
 * The days a dam kindled on the farm's record, oldest first (empty for another farm's doe, whose litters
 * are private to it): a kit of hers is born on one of them.
 */
export function useDamKindlingDays(damId: string | null): string[] {
  const litters = useQuery({ ...littersQueryOptions({ status: 'all', sort: 'kindledOn', dir: 'asc', damId: damId ?? undefined, page: 1, pageSize: 50 }), enabled: damId !== null });
  if (!damId || !litters.data) return [];
  return [...new Set(litters.data.items.map((l) => l.kindledOn))];
}
