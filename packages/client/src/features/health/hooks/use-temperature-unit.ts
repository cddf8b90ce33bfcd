import { useQuery } from '@tanstack/react-query';
import type { TemperatureUnit } from '@burrowline/shared';
import { farmDetailQueryOptions } from '../../farms';
import { useSession } from '../../../lib/session';

/** The signed-in person's farm's temperature unit (°F until the farm says otherwise). */
export function useTemperatureUnit(): TemperatureUnit {
  const { user } = useSession();
  const farm = useQuery({ ...farmDetailQueryOptions(user.farmId ?? ''), enabled: Boolean(user.farmId) });
  return farm.data?.temperatureUnit ?? 'F';
}
