import { Op, type Transaction } from 'sequelize';
import type { PlannedTask, TaskRecord, TaskSkip } from '@burrowline/shared';
import { AlmanacTask } from './task.model';

/**
 * Writing planned tasks, kept apart from the rest of the Almanac so the Herd can plan an arrival's
 * quarantine without an import cycle (this file knows no other domain).
 */

export interface TaskSource {
  coopId: string;
  farmId: string;
  /** The service, litter or arriving animal the tasks come from. */
  sourceId: string;
  serviceId?: string | null;
  litterId?: string | null;
  animalId?: string | null;
}

/** Inserts the planned tasks; a task already planned for the same source, key and anchor date is left as it is. */
export async function insertPlannedTasks(tx: Transaction, source: TaskSource, planned: PlannedTask[]): Promise<void> {
  if (planned.length === 0) return;
  await AlmanacTask.bulkCreate(
    planned.map((p) => ({
      coopId: source.coopId,
      farmId: source.farmId,
      kind: p.kind,
      key: p.key,
      anchor: p.anchor,
      anchorDate: p.anchorDate,
      sourceId: source.sourceId,
      serviceId: source.serviceId ?? null,
      litterId: source.litterId ?? null,
      animalId: source.animalId ?? null,
      dueOn: p.dueOn,
      windowStart: p.windowStart ?? null,
      windowEnd: p.windowEnd ?? null,
      ageDays: p.ageDays ?? null,
    })),
    { transaction: tx, ignoreDuplicates: true },
  );
}

/** A stored task as the shared planning functions read it. */
export function toTaskRecord(
  task: Pick<AlmanacTask, 'id' | 'sourceId' | 'kind' | 'key' | 'anchor' | 'anchorDate' | 'dueOn' | 'state' | 'windowStart' | 'windowEnd' | 'animalId'>,
): TaskRecord {
  return {
    id: task.id,
    sourceId: task.sourceId,
    kind: task.kind,
    key: task.key,
    anchor: task.anchor,
    anchorDate: task.anchorDate,
    dueOn: task.dueOn,
    state: task.state,
    windowStart: task.windowStart,
    windowEnd: task.windowEnd,
    animalId: task.animalId,
  };
}

/** Ticks tasks off as done on a date by what was recorded (a palpation, a kindling, a weaning). */
export async function markTasksDone(tx: Transaction, ids: string[], doneOn: string, doneBy: string | null): Promise<void> {
  if (ids.length === 0) return;
  const tasks = await AlmanacTask.findAll({ where: { id: { [Op.in]: ids }, state: { [Op.in]: ['open', 'moved'] } }, transaction: tx, lock: tx.LOCK.UPDATE });
  for (const task of tasks) {
    task.set({ state: 'done', doneOn, doneBy, completionReview: 'accepted', stateReason: null });
    await task.save({ transaction: tx });
  }
}

/** Skips open tasks with the reason they no longer apply. */
export async function skipTasks(tx: Transaction, skips: TaskSkip[]): Promise<void> {
  if (skips.length === 0) return;
  const reasons = new Map(skips.map((s) => [s.id, s.reason]));
  const tasks = await AlmanacTask.findAll({ where: { id: { [Op.in]: [...reasons.keys()] }, state: { [Op.in]: ['open', 'moved'] } }, transaction: tx, lock: tx.LOCK.UPDATE });
  for (const task of tasks) {
    task.set({ state: 'skipped', stateReason: reasons.get(task.id)! });
    await task.save({ transaction: tx });
  }
}
