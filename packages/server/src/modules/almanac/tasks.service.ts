import { Op, type Transaction, type WhereOptions } from 'sequelize';
import {
  addDays, daysBetween, defaultCycleSettings, defineAbilityFor, ErrorCode, WEIGH_IN_REACH_DAYS, needsAttention, subjectOf, plannedTaskKinds, type AgendaDto, type AgendaQuery, type AlmanacSummaryDto,
  type AlmanacTaskDto, type CycleSettings, type EntryReviewInput, type TaskAttention, type TaskBulkInput, type TaskUpdateInput, type SharedDaysDto
} from '@burrowline/shared';
import { selectPrepared } from '../../db/prepared';
import { withTenant } from '../../db/tenant';
import { animalRefColumnsSql, animalRefFactsOf, animalRefJoinSql, type AnimalRefFacts, type AnimalRefRow } from '../../lib/animal-ref';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { mentorIdOf, namesOf } from '../users/users.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { announceAlmanac } from './almanac-events.service';
import { farmClockOf, type FarmClock } from '../farms/farm-clock';
import { presentTask, type AlmanacPresentContext, type TaskFields, type TaskPresentContext } from './almanac.presenter';
import { AlmanacTask } from './task.model';
import { toTaskRecord } from './task-writer.service';
import { sharedDaysOfFarm } from './shared-days';

const kindOrder = new Map<string, number>(plannedTaskKinds.map((kind, index) => [kind, index]));

function byDue(a: Pick<AlmanacTask, 'dueOn' | 'kind' | 'id'>, b: Pick<AlmanacTask, 'dueOn' | 'kind' | 'id'>): number {
  return a.dueOn.localeCompare(b.dueOn) || (kindOrder.get(a.kind) ?? 0) - (kindOrder.get(b.kind) ?? 0) || a.id.localeCompare(b.id);
}

/** Animals, farms and people of these rows, loaded once, for presenting them on the farm's today. */
export async function presentContextOf(
  tx: Transaction,
  coopId: string,
  today: string,
  refs: { animalIds?: (string | null | undefined)[]; userIds?: (string | null | undefined)[] },
): Promise<AlmanacPresentContext> {
  const animalIds = (refs.animalIds ?? []).filter((id): id is string => Boolean(id));
  return {
    animals: await animalFactsOf(tx, coopId, animalIds),
    farms: await farmDirectoryOf(coopId, tx),
    names: await namesOf(refs.userIds ?? [], tx),
    today,
  };
}

/** Tasks as the API shows them, on the farm's today. */
export async function presentTasks(tx: Transaction, coopId: string, tasks: AlmanacTask[], today: string): Promise<AlmanacTaskDto[]> {
  return (await presentTaskLists(tx, coopId, [tasks], today))[0]!;
}

/** Several lists of tasks presented with one read of the animals and people they name. */
async function presentTaskLists(tx: Transaction, coopId: string, lists: AlmanacTask[][], today: string): Promise<AlmanacTaskDto[][]> {
  return (await presentWithAttention(tx, coopId, lists, null, today)).lists;
}

/**
 * Lists of tasks and what needs attention, presented with one read of the animals and people they name:
 * the attention names the doe it is about, so the banner can say whom to check and link to her.
 */
async function presentWithAttention(
  tx: Transaction, coopId: string, lists: AlmanacTask[][], attention: { tasks: AlmanacTask[]; settings: CycleSettings } | null, today: string,
): Promise<{ lists: AlmanacTaskDto[][]; attention: TaskAttention[] }> {
  const all = lists.flat();
  const named = [...all, ...(attention?.tasks ?? [])];
  const ctx = await presentContextOf(tx, coopId, today, { animalIds: named.map((t) => t.animalId), userIds: all.map((t) => t.doneBy) });
  return presentWithContext(lists, attention, ctx);
}

type AttentionInput<T> = { tasks: T[]; settings: CycleSettings } | null;

/** The same, with the animals and people already read (the agenda reads them in its own statement). */
function presentWithContext<T extends TaskFields & Parameters<typeof toTaskRecord>[0]>(
  lists: T[][], attention: AttentionInput<T>, ctx: TaskPresentContext,
): { lists: AlmanacTaskDto[][]; attention: TaskAttention[] } {
  const does = new Map([...ctx.animals].map(([id, a]) => [id, { id, name: a.name, tattoo: a.tattoo }]));
  return {
    lists: lists.map((tasks) => [...tasks].sort(byDue).map((t) => presentTask(t, ctx))),
    attention: attention ? needsAttention(attention.tasks.map(toTaskRecord), ctx.today, attention.settings, does) : [],
  };
}

/** The tasks of some services, litters or arrivals (for their own pages), inside the caller's transaction. */
export async function tasksOf(tx: Transaction, where: { serviceId?: string; litterId?: string; sourceIds?: string[] }): Promise<AlmanacTask[]> {
  const conditions: WhereOptions<AlmanacTask> = {};
  if (where.serviceId) Object.assign(conditions, { serviceId: where.serviceId });
  if (where.litterId) Object.assign(conditions, { litterId: where.litterId });
  if (where.sourceIds) Object.assign(conditions, { sourceId: { [Op.in]: where.sourceIds } });
  const tasks = await AlmanacTask.findAll({ where: conditions, transaction: tx, lock: tx.LOCK.UPDATE });
  return tasks.sort(byDue);
}

/** Open (or moved) tasks of a doe of these kinds: what a new service settles (her rebreed, her breed-back). */
export async function openTasksOfAnimal(tx: Transaction, animalId: string, kinds: string[]): Promise<AlmanacTask[]> {
  return AlmanacTask.findAll({
    where: { animalId, kind: { [Op.in]: kinds }, state: { [Op.in]: ['open', 'moved'] } },
    transaction: tx,
    lock: tx.LOCK.UPDATE,
  });
}

const OPEN_STATES = ['open', 'moved'];

/** A task of the agenda with the animal it names and who did it, as the agenda's statement reads it. */
type AgendaTaskRow = TaskFields & Pick<AlmanacTask, 'sourceId'> & AnimalRefRow<'animal'> & { doneByName: string | null };
type AgendaRow = { pendingReview: number; settings: Partial<CycleSettings> | null } & ({ [K in keyof AgendaTaskRow]: AgendaTaskRow[K] | null });

/**
 * The agenda's one statement: the farm's open tasks due by `$2`, with `history` its done and skipped ones
 * due in [`$3`, `$4`] too, each with the animal it names and who did it, beside the count of ticks waiting
 * for review and the farm's cycle settings (on every row, and alone when there is no task).
 */
function agendaSql(history: boolean): string {
  return `SELECT (SELECT count(*)::int FROM almanac_tasks r WHERE r.farm_id = $1 AND r.completion_review = 'pending') AS "pendingReview",
      (SELECT s.settings FROM farm_cycle_settings s WHERE s.farm_id = $1) AS settings, t.*
    FROM (SELECT 1) head LEFT JOIN LATERAL (
      SELECT t.id, t.farm_id AS "farmId", t.kind, t.key, t.anchor, t.anchor_date::text AS "anchorDate", t.source_id AS "sourceId",
        t.service_id AS "serviceId", t.litter_id AS "litterId", t.animal_id AS "animalId", t.due_on::text AS "dueOn",
        t.window_start::text AS "windowStart", t.window_end::text AS "windowEnd", t.age_days AS "ageDays", t.state,
        t.state_reason AS "stateReason", t.moved_from::text AS "movedFrom", t.done_on::text AS "doneOn", t.done_by AS "doneBy",
        t.completion_review AS "completionReview", t.review_comment AS "reviewComment", t.version,
        ${animalRefColumnsSql('a', 'animal')}, (SELECT u.name FROM users u WHERE u.id = t.done_by) AS "doneByName"
      FROM almanac_tasks t
      ${animalRefJoinSql('a', 't.animal_id')}
      WHERE t.farm_id = $1 AND ((t.state IN ('open', 'moved') AND t.due_on <= $2::date)
        ${history ? "OR (t.state IN ('done', 'skipped') AND t.due_on BETWEEN $3::date AND $4::date)" : ''})
    ) t ON true`;
}

/**
 * What the agenda and the week's cards show, in one read: the farm's tasks in [from, to] (open ones, or
 * every state with `include: 'all'`), its open tasks already late, and those due by today (what needs
 * attention), with the count of ticks waiting for review beside each row, presented on the farm's today.
 * The farm's rows only: the caller checked the actor may read its tasks.
 */
async function agendaOf(tx: Transaction, coopId: string, farmId: string, from: string, to: string, today: string, include: 'open' | 'all') {
  const openUntil = to > today ? to : today;
  const history = include === 'all';
  const rows = await selectPrepared<AgendaRow>(tx, agendaSql(history), history ? [farmId, openUntil, from, to] : [farmId, openUntil], { onlyStatement: true });
  const tasks = rows.filter((r): r is AgendaRow & AgendaTaskRow => r.id !== null);
  const settings: CycleSettings = { ...defaultCycleSettings(), ...(rows[0]!.settings ?? {}) };
  const animals = new Map<string, AnimalRefFacts>();
  const names = new Map<string, string>();
  for (const t of tasks) {
    const animal = animalRefFactsOf(t, 'animal');
    if (t.animalId && animal) animals.set(t.animalId, animal);
    if (t.doneBy && t.doneByName !== null) names.set(t.doneBy, t.doneByName);
  }
  const open = (t: AgendaTaskRow) => OPEN_STATES.includes(t.state);
  const inRange = tasks.filter((t) => t.dueOn >= from && t.dueOn <= to);
  const overdue = tasks.filter((t) => open(t) && t.dueOn < from);
  const ctx = { animals, farms: await farmDirectoryOf(coopId, tx), names, today };
  const presented = presentWithContext([inRange, overdue], { tasks: tasks.filter((t) => open(t) && t.dueOn <= today), settings }, ctx);
  return { tasks: presented.lists[0]!, overdue: presented.lists[1]!, attention: presented.attention, pendingReview: rows[0]!.pendingReview };
}

/**
 * The farm's agenda (an apprentice's: the mentor's) between two dates on the farm's clock, with the
 * open tasks already late and what must surface by itself. Default: today and the next 13 days
 * (`days` for more).
 */
export async function listAgenda(actor: SessionUser, q: AgendaQuery): Promise<AgendaDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'AlmanacTask', { farmId }, 'That Almanac');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const from = q.from ?? clock.today;
    const to = q.to ?? addDays(from, (q.days ?? 14) - 1);
    const agenda = await agendaOf(tx, actor.coopId, farmId, from, to, clock.today, q.include);
    return {
      farm: { id: farmId, name: clock.name },
      timeZone: clock.timeZone,
      today: clock.today,
      from,
      to,
      tasks: agenda.tasks,
      overdue: agenda.overdue,
      attention: agenda.attention,
      pendingReview: agenda.pendingReview,
    };
  });
}

/**
 * The shared days (processing days) the farm booked or hosts between two dates on its clock: the Almanac
 * shows them beside its tasks. Default: today and the next 13 days, as the agenda.
 */
export async function listSharedDays(actor: SessionUser, q: AgendaQuery): Promise<SharedDaysDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'AlmanacTask', { farmId }, 'That Almanac');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const from = q.from ?? clock.today;
    const to = q.to ?? addDays(from, (q.days ?? 14) - 1);
    const days = await sharedDaysOfFarm(tx, actor.coopId, farmId, from, to);
    return { from, to, days: days.map((d) => ({ id: d.id, date: d.date, startTime: d.startTime, title: d.title, link: d.link })) };
  });
}

/** Commons' cards: what is due today, in the rest of this week (to today + 6), and late. */
export async function almanacSummary(actor: SessionUser): Promise<AlmanacSummaryDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'AlmanacTask', { farmId }, 'That Almanac');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const weekEnd = addDays(clock.today, 6);
    const agenda = await agendaOf(tx, actor.coopId, farmId, clock.today, weekEnd, clock.today, 'open');
    return {
      farm: { id: farmId, name: clock.name },
      today: clock.today,
      weekEnd,
      dueToday: agenda.tasks.filter((t) => t.dueOn === clock.today),
      thisWeek: agenda.tasks.filter((t) => t.dueOn > clock.today),
      overdue: agenda.overdue,
      attention: agenda.attention,
      pendingReview: agenda.pendingReview,
    };
  });
}

type TaskChange = Record<string, [unknown, unknown]>;
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;
type ActionFields = DistributiveOmit<TaskUpdateInput, 'version'>;

/** Applies one action to one task already loaded and locked; returns what changed (for the history). */
function applyAction(actor: SessionUser, task: AlmanacTask, input: ActionFields, clock: FarmClock): TaskChange {
  const apprentice = actor.role === 'apprentice';
  const before = { state: task.state, dueOn: task.dueOn, doneOn: task.doneOn, stateReason: task.stateReason, completionReview: task.completionReview };
  const isOpen = task.state === 'open' || task.state === 'moved';
  switch (input.action) {
    case 'done': {
      if (!isOpen) throw new AppError(ErrorCode.conflict, 409, task.state === 'done' ? 'That task is already done' : 'That task was skipped; open it again first');
      const doneOn = input.doneOn ?? clock.today;
      if (doneOn > clock.today) throw AppError.validation({ doneOn: [`A task cannot be done on ${doneOn}, a date in the future (today is ${clock.today})`] });
      if (doneOn < task.anchorDate) throw AppError.validation({ doneOn: [`That is before the ${task.anchor} it follows (${task.anchorDate})`] });
      task.set({
        state: 'done', doneOn, doneBy: actor.id, note: input.note ?? task.note,
        completionReview: apprentice ? 'pending' : 'accepted', reviewedBy: null, reviewedAt: null, reviewComment: null,
      });
      break;
    }
    case 'move': {
      if (!isOpen) throw new AppError(ErrorCode.conflict, 409, 'Only an open task can be moved');
      if (input.dueOn === task.dueOn) throw AppError.validation({ dueOn: ['That is the day it is already on'] });
      if (input.dueOn < task.anchorDate) throw AppError.validation({ dueOn: [`That is before the ${task.anchor} it follows (${task.anchorDate})`] });
      task.set({ state: 'moved', movedFrom: task.movedFrom ?? task.dueOn, dueOn: input.dueOn, stateReason: input.reason || null });
      break;
    }
    case 'skip':
      if (!isOpen) throw new AppError(ErrorCode.conflict, 409, 'Only an open task can be skipped');
      task.set({ state: 'skipped', stateReason: input.reason });
      break;
    case 'reopen':
      if (isOpen) throw new AppError(ErrorCode.conflict, 409, 'That task is open already');
      task.set({
        state: task.movedFrom ? 'moved' : 'open', doneOn: null, doneBy: null, stateReason: null,
        completionReview: 'accepted', reviewedBy: null, reviewedAt: null, reviewComment: null,
      });
      break;
  }
  const changes: TaskChange = {};
  for (const [key, value] of Object.entries(before)) {
    const now = task.get(key as keyof typeof before);
    if (now !== value) changes[key] = [value, now];
  }
  return changes;
}

function checkActionAllowed(actor: SessionUser, farmId: string, action: TaskUpdateInput['action']): void {
  if (action === 'done') {
    ensureCan(actor, 'complete', 'AlmanacTask', { farmId }, 'That task');
  } else {
    ensureCan(actor, 'update', 'AlmanacTask', { farmId }, 'That task', 'Apprentices tick tasks off; members move, skip or reopen them');
  }
}

async function loadForChange(tx: Transaction, actor: SessionUser, ids: string[]): Promise<AlmanacTask[]> {
  const tasks = await AlmanacTask.findAll({ where: { id: { [Op.in]: ids }, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE, order: [['id', 'ASC']] });
  const ability = defineAbilityFor(actor);
  // Another farm's tasks do not exist for the actor.
  const visible = tasks.filter((t) => t.farmId === actor.farmId && ability.can('read', subjectOfTask(t)));
  if (visible.length !== ids.length) throw AppError.notFound(ids.length === 1 ? 'That task' : 'One of those tasks');
  return visible;
}

function subjectOfTask(task: AlmanacTask) {
  return subjectOf('AlmanacTask', { coopId: task.coopId, farmId: task.farmId });
}

async function saveChanges(tx: Transaction, actor: SessionUser, task: AlmanacTask, changes: TaskChange): Promise<void> {
  await task.save({ transaction: tx });
  if (Object.keys(changes).length > 0) {
    await recordChanges({ coopId: actor.coopId, tableName: 'almanac_tasks', recordId: task.id, actorUserId: actor.id, changes }, tx);
  }
}

/**
 * One task done (on a date, not in the future), moved to another day, skipped with a reason, or opened
 * again, from the version it was seen at (else 409). An apprentice may only tick tasks off, and the tick
 * waits for the mentor's review.
 */
export async function updateTask(actor: SessionUser, taskId: string, input: TaskUpdateInput): Promise<AlmanacTaskDto> {
  const farmId = farmOf(actor);
  return withTenant(actor, async (tx) => {
    const [task] = await loadForChange(tx, actor, [taskId]);
    checkActionAllowed(actor, farmId, input.action);
    if (task!.version !== input.version) throw AppError.staleVersion();
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const changes = applyAction(actor, task!, input, clock);
    await saveChanges(tx, actor, task!, changes);
    announceAlmanac(tx, [farmId]);
    const [presented] = await presentTasks(tx, actor.coopId, [task!], clock.today);
    return presented!;
  });
}

/**
 * A weighing of a litter's kits (in a grow-out group) on a day ticks off that litter's weigh-in task due
 * nearest to it within a week, done on the day weighed, in the weighing's transaction. An apprentice's
 * weighing ticks it for the mentor's review, as her own tick would.
 */
export async function completeWeighInTasksOf(tx: Transaction, actor: SessionUser, farmId: string, litterIds: string[], weighedOn: string, note: string): Promise<void> {
  if (litterIds.length === 0 || !defineAbilityFor(actor).can('complete', subjectOf('AlmanacTask', { coopId: actor.coopId, farmId }))) return;
  const tasks = await AlmanacTask.findAll({
    where: {
      coopId: actor.coopId, farmId, litterId: { [Op.in]: litterIds }, kind: 'weigh_in', state: { [Op.in]: ['open', 'moved'] },
      dueOn: { [Op.between]: [addDays(weighedOn, -WEIGH_IN_REACH_DAYS), addDays(weighedOn, WEIGH_IN_REACH_DAYS)] },
      anchorDate: { [Op.lte]: weighedOn },
    },
    transaction: tx, lock: tx.LOCK.UPDATE, order: [['id', 'ASC']],
  });
  const distance = (t: AlmanacTask) => Math.abs(daysBetween(t.dueOn, weighedOn));
  const nearest = new Map<string, AlmanacTask>();
  for (const task of tasks) {
    const held = nearest.get(task.litterId!);
    if (!held || distance(task) < distance(held)) nearest.set(task.litterId!, task);
  }
  if (nearest.size === 0) return;
  const clock = await farmClockOf(tx, actor.coopId, farmId);
  for (const task of nearest.values()) await saveChanges(tx, actor, task, applyAction(actor, task, { action: 'done', doneOn: weighedOn, note }, clock));
  announceAlmanac(tx, [farmId]);
}

/** The same action on several tasks at once, all or none (one stale or refused task refuses them all). */
export async function bulkUpdateTasks(actor: SessionUser, input: TaskBulkInput): Promise<{ tasks: AlmanacTaskDto[] }> {
  const farmId = farmOf(actor);
  return withTenant(actor, async (tx) => {
    const tasks = await loadForChange(tx, actor, input.tasks.map((t) => t.id));
    checkActionAllowed(actor, farmId, input.action);
    const versions = new Map(input.tasks.map((t) => [t.id, t.version]));
    if (tasks.some((t) => t.version !== versions.get(t.id))) throw AppError.staleVersion();
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const { tasks: _ids, ...rest } = input;
    const action = rest as ActionFields;
    for (const task of tasks) {
      const changes = applyAction(actor, task, action, clock);
      await saveChanges(tx, actor, task, changes);
    }
    announceAlmanac(tx, [farmId]);
    return { tasks: await presentTasks(tx, actor.coopId, tasks, clock.today) };
  });
}

/** A member accepts an apprentice's tick, or returns it with a comment (the task is open again). */
export async function reviewTask(actor: SessionUser, taskId: string, input: EntryReviewInput): Promise<AlmanacTaskDto> {
  farmOf(actor);
  return withTenant(actor, (tx) => reviewTaskIn(tx, actor, taskId, input));
}

/** The same review inside the caller's transaction (the mentor's queue decides many at once). */
export async function reviewTaskIn(tx: Transaction, actor: SessionUser, taskId: string, input: EntryReviewInput): Promise<AlmanacTaskDto> {
  const farmId = farmOf(actor);
  {
    const [task] = await loadForChange(tx, actor, [taskId]);
    const mentorId = await mentorIdOf(task!.doneBy, tx);
    ensureCan(actor, 'review', 'AlmanacTask', { farmId, mentorId }, 'That task', 'Only her mentor reviews an apprentice\'s ticks');
    if (task!.version !== input.version) throw AppError.staleVersion();
    if (task!.completionReview !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That tick was already reviewed');
    if (task!.doneBy === actor.id) throw new AppError(ErrorCode.forbidden, 403, 'Someone else reviews your own ticks');
    const returned = input.decision === 'returned';
    task!.set({
      completionReview: input.decision,
      reviewedBy: actor.id,
      reviewedAt: new Date(),
      reviewComment: input.comment ?? null,
      ...(returned ? { state: task!.movedFrom ? 'moved' : 'open', doneOn: null } : {}),
    });
    await saveChanges(tx, actor, task!, { completionReview: ['pending', input.decision] });
    announceAlmanac(tx, [farmId]);
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const [presented] = await presentTasks(tx, actor.coopId, [task!], clock.today);
    return presented!;
  }
}
