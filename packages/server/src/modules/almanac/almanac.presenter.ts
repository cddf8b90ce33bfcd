import {
  daysBetween, TASK_KIND_LABELS, taskTiming, type AlmanacTaskDto, type BreedingCheck, type PalpationDto, type ServiceDto, type ServiceListItemDto, type TreatmentDto, type TreatmentRoute,
} from '@burrowline/shared';
import { animalLabel, presentAnimalRef, type AnimalFacts } from '../animals/animal-facts.service';
import { animalRef, type AnimalRefFacts } from '../../lib/animal-ref';
import type { Palpation } from './palpation.model';
import type { ServiceRecord } from './service-record.model';
import type { AlmanacTask } from './task.model';
import type { Treatment } from './treatment.model';

export { animalLabel, presentAnimalRef };

/** What presenting needs besides the rows: animals, farm names, people's names, the farm's today. */
export interface AlmanacPresentContext {
  animals: Map<string, AnimalFacts>;
  farms: Map<string, { id: string; name: string }>;
  names: Map<string, string>;
  today: string;
}

const person = (id: string | null, names: Map<string, string>) => (id ? { id, name: names.get(id) ?? 'Someone' } : null);

/** What of a task presenting reads (a model instance, or a plain row a list reads). */
export type TaskFields = Pick<
  AlmanacTask,
  | 'id' | 'farmId' | 'kind' | 'key' | 'dueOn' | 'windowStart' | 'windowEnd' | 'anchor' | 'anchorDate' | 'ageDays' | 'state' | 'stateReason'
  | 'movedFrom' | 'doneOn' | 'doneBy' | 'completionReview' | 'reviewComment' | 'serviceId' | 'litterId' | 'animalId' | 'version'
>;

/** What presenting a task needs besides it: only the animals' names, tattoos, sexes and keepers. */
export type TaskPresentContext = Omit<AlmanacPresentContext, 'animals'> & { animals: Map<string, AnimalRefFacts> };

export function presentTask(task: TaskFields, ctx: TaskPresentContext): AlmanacTaskDto {
  const { timing, daysLate } = taskTiming(task, ctx.today);
  const animal = task.animalId ? ctx.animals.get(task.animalId) : undefined;
  return {
    id: task.id,
    farmId: task.farmId,
    kind: task.kind,
    key: task.key,
    title: TASK_KIND_LABELS[task.kind],
    subject: task.animalId ? animalLabel(animal) : '',
    dueOn: task.dueOn,
    windowStart: task.windowStart,
    windowEnd: task.windowEnd,
    anchor: task.anchor,
    anchorDate: task.anchorDate,
    ageDays: task.ageDays,
    state: task.state,
    stateReason: task.stateReason,
    movedFrom: task.movedFrom,
    doneOn: task.doneOn,
    doneBy: person(task.doneBy, ctx.names),
    completionReview: task.completionReview,
    reviewComment: task.reviewComment,
    timing,
    daysLate,
    serviceId: task.serviceId,
    litterId: task.litterId,
    animal: task.animalId ? animalRef(task.animalId, animal, ctx.farms) : null,
    version: task.version,
  };
}

export function presentPalpation(p: Palpation, servicedOn: string, names: Map<string, string>): PalpationDto {
  return {
    id: p.id,
    palpatedOn: p.palpatedOn,
    result: p.result,
    notes: p.notes,
    dayAfterService: daysBetween(servicedOn, p.palpatedOn),
    recordedBy: person(p.recordedBy, names),
    reviewState: p.reviewState === 'pending' ? 'pending' : 'accepted',
  };
}

export function presentServiceListItem(
  s: ServiceRecord,
  ctx: AlmanacPresentContext & { kindlingStatus: ServiceDto['kindlingStatus']; lastPalpation: ServiceListItemDto['lastPalpation'] },
): ServiceListItemDto {
  return {
    id: s.id,
    doe: presentAnimalRef(s.doeId, ctx),
    buck: presentAnimalRef(s.buckId, ctx),
    servicedOn: s.servicedOn,
    status: s.status,
    closedOn: s.closedOn,
    kindlingStatus: ctx.kindlingStatus,
    litterId: s.litterId,
    lastPalpation: ctx.lastPalpation,
  };
}

export function presentService(
  s: ServiceRecord,
  extra: { palpations: Palpation[]; tasks: AlmanacTask[]; kindlingStatus: ServiceDto['kindlingStatus'] },
  ctx: AlmanacPresentContext,
): ServiceDto {
  return {
    id: s.id,
    farmId: s.farmId,
    doe: presentAnimalRef(s.doeId, ctx),
    buck: presentAnimalRef(s.buckId, ctx),
    servicedOn: s.servicedOn,
    status: s.status,
    closedOn: s.closedOn,
    closeReason: s.closeReason,
    notes: s.notes,
    warnings: s.warnings as BreedingCheck[],
    palpations: extra.palpations.map((p) => presentPalpation(p, s.servicedOn, ctx.names)),
    litterId: s.litterId,
    kindlingStatus: extra.kindlingStatus,
    dayToday: daysBetween(s.servicedOn, ctx.today),
    tasks: extra.tasks.map((t) => presentTask(t, ctx)),
    recordedBy: person(s.recordedBy, ctx.names),
    version: s.version,
  };
}

/** A treatment as the Health tab shows it; `groupNames` names the farm's grow-out groups. */
export function presentTreatment(t: Treatment, ctx: AlmanacPresentContext, groupNames: Map<string, string>): TreatmentDto {
  return {
    id: t.id,
    animal: t.animalId ? presentAnimalRef(t.animalId, ctx) : null,
    group: t.groupId ? { id: t.groupId, name: groupNames.get(t.groupId) ?? 'A grow-out group' } : null,
    treatment: t.treatment,
    dose: t.dose,
    route: (t.route as TreatmentRoute | null) ?? null,
    veterinarian: t.veterinarian,
    startedOn: t.startedOn,
    lastDoseOn: t.lastDoseOn,
    withdrawalEndsOn: t.endsOn,
    endsOn: t.endsOn,
    withdrawalDays: t.withdrawalDays,
    underWithdrawal: t.startedOn <= ctx.today && t.endsOn >= ctx.today,
    notes: t.notes,
    recordedBy: person(t.recordedBy, ctx.names),
  };
}
