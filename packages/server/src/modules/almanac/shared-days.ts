import type { Transaction } from 'sequelize';
import { port } from '../../lib/port';

/** A shared day a farm takes part in (a processing day it booked or hosts), as the Almanac and its feed show it. */
export interface SharedDayEvent {
  id: string;
  date: string;
  startTime: string;
  title: string;
  description: string;
  link: string;
  version: number;
}

/**
 * The shared days of a farm between two dates. Processing days build on the Almanac's withdrawals, so the
 * Almanac cannot import them; the composition root plugs them in (none until it does).
 */
export const sharedDaysOfFarm = port<(tx: Transaction, coopId: string, farmId: string, from: string, to: string) => Promise<SharedDayEvent[]>>(
  'shared days of a farm',
  async () => [],
);
