import { useQuery } from '@tanstack/react-query';
import type { WeightUnit } from '@burrowline/shared';
import { farmDetailQueryOptions } from '../../farms';
import { useSession } from '../../../lib/session';

/** The signed-in person's farm's weight units (pounds and ounces until the farm says otherwise). */
export function useWeightUnit(): WeightUnit {
  const { user } = useSession();
  const farm = useQuery({ ...farmDetailQueryOptions(user.farmId ?? ''), enabled: Boolean(user.farmId) });
  return farm.data?.weightUnit ?? 'lb_oz';
}
