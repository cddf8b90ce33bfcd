import type { Transaction } from 'sequelize';
import {
  checkPalpationDate, hasBreedingErrors, plannedTaskKinds, type BreedingCheck, type PlannedTaskKind, type TaskAnchor, type TaskState,
} from '@burrowline/shared';
import { animalFactsOf } from '../animals/animal-facts.service';
import { Palpation } from './palpation.model';
import { ServiceRecord } from './service-record.model';
import { AlmanacTask } from './task.model';

/**
 * Bulk loading of a farm's breeding history (the demo co-op's two years), inside the caller's
 * transaction. The records are checked with the same shared rules as one-by-one entry (a doe as the
 * doe, no date in the future, a palpation after its service, one open service per doe) and refused
 * whole if one fails; the caller plans the tasks with the shared planning functions.
 */

export interface ImportedService {
  id: string;
  farmId: string;
  doeId: string;
  buckId: string;
  servicedOn: string;
  status: 'open' | 'kindled' | 'empty' | 'missed';
  closedOn: string | null;
  closeReason: string | null;
  notes?: string;
  recordedBy: string | null;
}

export interface ImportedPalpation {
  serviceId: string;
  palpatedOn: string;
  result: 'positive' | 'negative';
  notes?: string;
  recordedBy: string | null;
}

export interface ImportedTask {
  farmId: string;
  kind: PlannedTaskKind;
  key: string;
  anchor: TaskAnchor;
  anchorDate: string;
  sourceId: string;
  serviceId: string | null;
  litterId: string | null;
  animalId: string | null;
  dueOn: string;
  windowStart: string | null;
  windowEnd: string | null;
  ageDays: number | null;
  state: TaskState;
  stateReason: string | null;
  movedFrom?: string | null;
  doneOn: string | null;
  doneBy: string | null;
  completionReview?: 'accepted' | 'pending';
}

export class ImportRefused extends Error {
  constructor(readonly problems: string[]) {
    super(`The breeding history was refused: ${problems.slice(0, 5).join('; ')}`);
    this.name = 'ImportRefused';
  }
}

/**
 * Services and palpations. A kindled service is stored closed (as missed) until its litter exists;
 * `markServicesKindled` then links it (the two refer to each other).
 */
export async function importServices(tx: Transaction, coopId: string, today: string, services: ImportedService[], palpations: ImportedPalpation[]): Promise<void> {
  const problems: string[] = [];
  const facts = await animalFactsOf(tx, coopId, services.flatMap((s) => [s.doeId, s.buckId]));
  const byId = new Map(services.map((s) => [s.id, s]));
  const openPerDoe = new Map<string, number>();
  for (const s of services) {
    const doe = facts.get(s.doeId);
    const buck = facts.get(s.buckId);
    if (doe?.sex !== 'doe') problems.push(`service ${s.id}: the doe is not a doe`);
    if (buck?.sex !== 'buck') problems.push(`service ${s.id}: the buck is not a buck`);
    if (s.servicedOn > today) problems.push(`service ${s.id}: ${s.servicedOn} is in the future`);
    if (s.closedOn && (s.closedOn < s.servicedOn || s.closedOn > today)) problems.push(`service ${s.id}: closed on ${s.closedOn}`);
    if (s.status === 'open') openPerDoe.set(s.doeId, (openPerDoe.get(s.doeId) ?? 0) + 1);
  }
  for (const [doeId, n] of openPerDoe) if (n > 1) problems.push(`doe ${doeId} has ${n} open services`);
  for (const p of palpations) {
    const s = byId.get(p.serviceId);
    if (!s) problems.push(`palpation of an unknown service ${p.serviceId}`);
    else {
      const checks: BreedingCheck[] = checkPalpationDate(s.servicedOn, p.palpatedOn, today);
      if (hasBreedingErrors(checks)) problems.push(`palpation of ${s.id}: ${checks.map((c) => c.message).join(', ')}`);
    }
  }
  if (problems.length > 0) throw new ImportRefused(problems);
  await ServiceRecord.bulkCreate(
    services.map((s) => ({
      id: s.id, coopId, farmId: s.farmId, doeId: s.doeId, buckId: s.buckId, servicedOn: s.servicedOn, notes: s.notes ?? '',
      status: s.status === 'kindled' ? 'missed' : s.status, closedOn: s.closedOn, closeReason: s.closeReason, litterId: null, recordedBy: s.recordedBy,
    })),
    { transaction: tx },
  );
  await Palpation.bulkCreate(
    palpations.map((p) => ({ coopId, farmId: byId.get(p.serviceId)!.farmId, serviceId: p.serviceId, palpatedOn: p.palpatedOn, result: p.result, notes: p.notes ?? '', recordedBy: p.recordedBy })),
    { transaction: tx },
  );
}

/** Links imported services to the litters they gave (kindled, closed on the kindling date). */
export async function markServicesKindled(tx: Transaction, litters: { serviceId: string; litterId: string; kindledOn: string }[]): Promise<void> {
  for (const l of litters) {
    await ServiceRecord.update({ status: 'kindled', closedOn: l.kindledOn, closeReason: null, litterId: l.litterId }, { where: { id: l.serviceId }, transaction: tx });
  }
}

/** Tasks with their states as the history left them (planned by the caller with the shared functions). */
export async function importTasks(tx: Transaction, coopId: string, tasks: ImportedTask[]): Promise<void> {
  const known = new Set<string>(plannedTaskKinds);
  const bad = tasks.filter((t) => !known.has(t.kind) || (t.state === 'done') !== (t.doneOn !== null) || (t.state === 'skipped' && !t.stateReason));
  if (bad.length > 0) throw new ImportRefused(bad.map((t) => `task ${t.kind} of ${t.sourceId} (${t.state})`));
  for (let i = 0; i < tasks.length; i += 1000) {
    await AlmanacTask.bulkCreate(
      tasks.slice(i, i + 1000).map((t) => ({ ...t, coopId, completionReview: t.completionReview ?? 'accepted', movedFrom: t.movedFrom ?? null })),
      { transaction: tx },
    );
  }
}

/** Whether the co-op has any breeding history yet (the demo loads it once). */
export async function coopHasServices(coopId: string, tx: Transaction): Promise<boolean> {
  return (await ServiceRecord.count({ where: { coopId }, transaction: tx })) > 0;
}
