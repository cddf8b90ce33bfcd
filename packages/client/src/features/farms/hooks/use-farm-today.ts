import { useQuery } from '@tanstack/react-query';
import { todayIn } from '@burrowline/shared';
import { useSession } from '../../../lib/session';
import { farmDetailQueryOptions } from '../api/get-farm';

/**
 * Today on the signed-in person's farm, in its time zone: the server refuses dates after the farm's today,
 * so a form's default must not be the device's tomorrow (a phone set to UTC, a trip across zones).
 */
export function useFarmToday(): string {
  const { user } = useSession();
  const farm = useQuery({ ...farmDetailQueryOptions(user.farmId ?? ''), enabled: Boolean(user.farmId) });
  return todayIn(farm.data?.timeZone || Intl.DateTimeFormat().resolvedOptions().timeZone);
}
