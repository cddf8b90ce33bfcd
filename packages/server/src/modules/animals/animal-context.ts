import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms, todayIn } from '@burrowline/shared';
import type { SessionUser } from '../../http/passport';
import { publish } from '../../lib/realtime';
import { breedMapOf } from '../breeds/breeds.service';
import { farmDirectoryOf } from '../farms/farms.service';
import type { PresentContext } from './animals.presenter';

const DEFAULT_TIME_ZONE = 'America/Chicago';

/** Breeds, farms and "today" on the actor's own farm clock, loaded once per request. */
export async function presentContextFor(actor: Pick<SessionUser, 'coopId' | 'farmId'>, tx: Transaction): Promise<PresentContext> {
  const breeds = await breedMapOf(actor.coopId, tx);
  const farms = await farmDirectoryOf(actor.coopId, tx);
  const timeZone = (actor.farmId && farms.get(actor.farmId)?.timeZone) || DEFAULT_TIME_ZONE;
  return { breeds, farms, viewerFarmId: actor.farmId, today: todayIn(timeZone) };
}

/** Live updates after commit: the farms whose herd changed, and the co-op when pedigree figures moved. */
export function announceAfterCommit(
  tx: Transaction,
  coopId: string,
  change: { farmIds: (string | null | undefined)[]; animalId: string | null; figuresChanged: number },
): void {
  tx.afterCommit(() => {
    for (const farmId of new Set(change.farmIds.filter((id): id is string => Boolean(id)))) {
      publish(rooms.farm(farmId), RealtimeEvent.herdChanged, { farmId, animalId: change.animalId });
    }
    if (change.figuresChanged > 0) publish(rooms.coop(coopId), RealtimeEvent.pedigreeChanged, { changedCount: change.figuresChanged });
  });
}
