import type { Transaction } from 'sequelize';
import { defineAbilityFor, RealtimeEvent, rooms } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { publish } from '../../lib/realtime';
import { breedMapOf } from '../breeds/breeds.service';
import { farmTodayIn } from '../farms/farm-clock';
import { farmDirectoryOf } from '../farms/farms.service';
import type { PresentContext } from './animals.presenter';

/** Breeds, farms and "today" on the actor's own farm clock, loaded once per request. */
export async function presentContextFor(actor: Pick<SessionUser, 'coopId' | 'farmId'> & Partial<SessionUser>, tx: Transaction): Promise<PresentContext> {
  const breeds = await breedMapOf(actor.coopId, tx);
  const farms = await farmDirectoryOf(actor.coopId, tx);
  const ability = actor.id && actor.role ? defineAbilityFor({ id: actor.id, coopId: actor.coopId, role: actor.role, farmId: actor.farmId, mentorId: actor.mentorId ?? null }) : null;
  return { breeds, farms, viewerFarmId: actor.farmId, ability, today: farmTodayIn(farms, actor.farmId) };
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
