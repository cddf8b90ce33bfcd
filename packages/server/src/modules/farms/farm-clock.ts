import type { Transaction } from 'sequelize';
import { todayIn } from '@burrowline/shared';
import { DEFAULT_FARM_TIME_ZONE } from './farm-defaults';
import { farmDirectoryOf } from './farms.service';

export { DEFAULT_FARM_TIME_ZONE };

export interface FarmClock {
  farmId: string;
  name: string;
  timeZone: string;
  /** Today on the farm's own clock: what "today", "overdue" and "in the future" mean for it. */
  today: string;
}

type FarmDirectory = Awaited<ReturnType<typeof farmDirectoryOf>>;

/** The farm's time zone from a directory already loaded by the caller. */
export function timeZoneIn(directory: FarmDirectory, farmId: string | null | undefined): string {
  return (farmId && directory.get(farmId)?.timeZone) || DEFAULT_FARM_TIME_ZONE;
}

/** The farm's today from a directory already loaded by the caller. `now` is injectable for scheduled work. */
export function farmTodayIn(directory: FarmDirectory, farmId: string | null | undefined, now: Date = new Date()): string {
  return todayIn(timeZoneIn(directory, farmId), now);
}

/** The farm's name, time zone and today, inside the caller's transaction. `now` is injectable for the morning e-mail. */
export async function farmClockOf(tx: Transaction, coopId: string, farmId: string, now: Date = new Date()): Promise<FarmClock> {
  const directory = await farmDirectoryOf(coopId, tx);
  const timeZone = timeZoneIn(directory, farmId);
  return { farmId, name: directory.get(farmId)?.name ?? 'A former member farm', timeZone, today: todayIn(timeZone, now) };
}

/** Today on the farm's clock, inside the caller's transaction. */
export async function farmTodayOf(tx: Transaction, coopId: string, farmId: string): Promise<string> {
  return (await farmClockOf(tx, coopId, farmId)).today;
}
