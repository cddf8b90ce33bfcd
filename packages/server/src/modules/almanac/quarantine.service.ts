import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../../db/sequelize';
import { planQuarantine } from '@burrowline/shared';
import { getCoop } from '../coops/coops.service';
import { announceAlmanac } from './almanac-events.service';
import { insertPlannedTasks } from './task-writer.service';

export interface Arrival {
  coopId: string;
  /** The farm the animal arrives at (bought, traded, lent to it, or back home from a loan). */
  farmId: string;
  animalId: string;
  arrivedOn: string;
}

/**
 * Plans an arriving animal's quarantine under the co-op's rule (`quarantine_days`; isolating new or
 * returning rabbits for 30 days is a common recommendation for RHDV2, Minnesota Board of Animal Health):
 * a task on the day it may join the herd, spanning the isolation. Call it inside the transaction that
 * records the arrival (the Herd does, for arrivals, transfers, loans and returns); planning the same
 * arrival twice adds nothing. A co-op with no quarantine rule (0 days) gets no task.
 */
export async function planArrivalQuarantine(tx: Transaction, arrival: Arrival): Promise<void> {
  const coop = await getCoop(arrival.coopId, tx);
  const days = coop?.quarantineDays ?? 0;
  const planned = planQuarantine(arrival.arrivedOn, days).map((task) => ({ ...task, windowStart: arrival.arrivedOn, windowEnd: task.dueOn }));
  if (planned.length === 0) return;
  await insertPlannedTasks(tx, { coopId: arrival.coopId, farmId: arrival.farmId, sourceId: arrival.animalId, animalId: arrival.animalId }, planned);
  announceAlmanac(tx, [arrival.farmId]);
}

/**
 * The arrival quarantines covering a date, by animal: its last day (the Swap Board refuses to list an
 * animal still isolated after arriving). A quarantine ticked off as done ends it early.
 */
export async function quarantinesCovering(tx: Transaction, animalIds: string[], date: string): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  if (animalIds.length === 0) return out;
  const rows = await database().query<{ animal_id: string; ends_on: string }>(
    `SELECT animal_id, max(due_on)::text AS ends_on FROM almanac_tasks
      WHERE kind = 'quarantine_end' AND animal_id = ANY($1::uuid[]) AND state IN ('open', 'moved')
        AND coalesce(window_start, anchor_date) <= $2::date AND due_on > $2::date
      GROUP BY animal_id`,
    { bind: [animalIds, date], type: QueryTypes.SELECT, transaction: tx },
  );
  for (const row of rows) out.set(row.animal_id, row.ends_on);
  return out;
}
