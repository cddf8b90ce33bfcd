import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms } from '@burrowline/shared';
import { publish } from '../../lib/realtime';

/** Live updates after commit, to each farm's room: the Almanac (tasks, services, settings) changed. */
export function announceAlmanac(tx: Transaction, farmIds: (string | null | undefined)[]): void {
  tx.afterCommit(() => {
    for (const farmId of new Set(farmIds.filter((id): id is string => Boolean(id)))) {
      publish(rooms.farm(farmId), RealtimeEvent.almanacChanged, { farmId });
    }
  });
}
