import { subjectOf } from '@burrowline/shared';
import { useAbility } from '../../../lib/ability';
import { useSession } from '../../../lib/session';

/** A farm DTO carries no coopId; every farm the client sees belongs to the signed-in person's co-op. */
export function useCanEditFarm(farmId: string): boolean {
  const ability = useAbility();
  const { coop } = useSession();
  return ability.can('update', subjectOf('Farm', { id: farmId, coopId: coop.id }));
}
