import { subjectOf } from '@burrowline/shared';
import { useAbility } from '../../../lib/ability';
import { useSession } from '../../../lib/session';

/** What the signed-in person may do in their farm's Almanac (the server checks again). */
export function useAlmanacRights() {
  const ability = useAbility();
  const { user, coop } = useSession();
  const on = (type: Parameters<typeof subjectOf>[0], extra: Record<string, unknown> = {}) => subjectOf(type, { coopId: coop.id, farmId: user.farmId, ...extra });
  return {
    farmId: user.farmId,
    /** Members: record services, move and skip tasks, change settings. */
    canPlan: ability.can('update', on('AlmanacTask')),
    canTick: ability.can('complete', on('AlmanacTask')),
    canReview: ability.can('review', on('AlmanacTask')),
    canRecordLitters: ability.can('create', on('Litter')),
    canRecordCounts: ability.can('create', on('LitterEvent', { enteredBy: user.id })),
    canManageFeed: ability.can('create', on('CalendarFeed')),
    isApprentice: user.role === 'apprentice',
  };
}
