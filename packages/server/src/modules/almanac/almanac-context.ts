import type { Transaction } from 'sequelize';
import { RealtimeEvent, rooms, todayIn } from '@burrowline/shared';
import { publish } from '../../lib/realtime';
import { farmDirectoryOf } from '../farms/farms.service';

const DEFAULT_TIME_ZONE = 'America/Chicago';

export interface FarmClock {
  farmId: string;
  name: string;
  timeZone: string;
  /** Today on the farm's own clock: what "today", "overdue" and "in the future" mean for it. */
  today: string;
}

/** The farm's name, time zone and today, inside the caller's transaction. `now` is injectable for the morning e-mail. */
export async function farmClockOf(tx: Transaction, coopId: string, farmId: string, now: Date = new Date()): Promise<FarmClock> {
  const farm = (await farmDirectoryOf(coopId, tx)).get(farmId);
  const timeZone = farm?.timeZone || DEFAULT_TIME_ZONE;
  return { farmId, name: farm?.name ?? 'A former member farm', timeZone, today: todayIn(timeZone, now) };
}

/** Live updates after commit, to each farm's room: the Almanac (tasks, services, settings) changed. */
export function announceAlmanac(tx: Transaction, farmIds: (string | null | undefined)[]): void {
  tx.afterCommit(() => {
    for (const farmId of new Set(farmIds.filter((id): id is string => Boolean(id)))) {
      publish(rooms.farm(farmId), RealtimeEvent.almanacChanged, { farmId });
    }
  });
}
