import { literal, Op, type Transaction, type WhereOptions } from 'sequelize';
import {
  addDays, daysBetween, defineAbilityFor, ErrorCode, WEIGH_IN_REACH_DAYS, needsAttention, subjectOf, plannedTaskKinds, type AgendaDto, type AgendaQuery, type AlmanacSummaryDto,
  type AlmanacTaskDto, type CycleSettings, type EntryReviewInput, type TaskAttention, type TaskBulkInput, type TaskUpdateInput, type SharedDaysDto
} from '@burrowline/shared';
import { accessibleWhere } from '../../db/scope';
import { database } from '../../db/sequelize';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { mentorIdOf, namesOf } from '../users/users.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { announceAlmanac } from './almanac-events.service';
import { farmClockOf, type FarmClock } from '../farms/farm-clock';
import { presentTask, type AlmanacPresentContext } from './almanac.presenter';
import { settingsOf } from './cycle-settings.service';
import { AlmanacTask } from './task.model';
import { toTaskRecord } from './task-writer.service';
import { sharedDaysOfFarm } from './shared-days';

const kindOrder = new Map<string, number>(plannedTaskKinds.map((kind, index) => [kind, index]));

function byDue(a: AlmanacTask, b: AlmanacTask): number {
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
  const does = new Map([...ctx.animals.values()].map((a) => [a.id, { id: a.id, name: a.name, tattoo: a.tattoo }]));
  return {
    lists: lists.map((tasks) => [...tasks].sort(byDue).map((t) => presentTask(t, ctx))),
    attention: attention ? needsAttention(attention.tasks.map(toTaskRecord), today, attention.settings, does) : [],
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

/**
 * What the agenda and the week's cards show, in one read: the farm's tasks in [from, to] (open ones, or
 * every state with `include: 'all'`), its open tasks already late, and those due by today (what needs
 * attention), with the count of ticks waiting for review beside each row.
 */
async function agendaOf(tx: Transaction, actor: SessionUser, farmId: string, from: string, to: string, today: string, include: 'open' | 'all') {
  const scope = accessibleWhere(defineAbilityFor(actor), 'read', 'AlmanacTask');
  const openUntil = to > today ? to : today;
  const tasks = await AlmanacTask.findAll({
    where: {
      [Op.and]: [scope, { farmId }, {
        [Op.or]: [
          { state: { [Op.in]: OPEN_STATES }, dueOn: { [Op.lte]: openUntil } },
          ...(include === 'all' ? [{ state: { [Op.in]: ['done', 'skipped'] }, dueOn: { [Op.between]: [from, to] } }] : []),
        ],
      }],
    },
    attributes: {
      include: [[literal(`(SELECT count(*)::int FROM almanac_tasks review WHERE review.farm_id = ${database().escape(farmId)} AND review.completion_review = 'pending')`), 'pendingReview']],
    },
    transaction: tx,
  });
  const open = (t: AlmanacTask) => OPEN_STATES.includes(t.state);
  const pendingReview = tasks.length > 0
    ? Number((tasks[0]!.dataValues as unknown as { pendingReview: number }).pendingReview)
    : await AlmanacTask.count({ where: { farmId, completionReview: 'pending' }, transaction: tx });
  const { settings } = await settingsOf(tx, farmId);
  return {
    inRange: tasks.filter((t) => t.dueOn >= from && t.dueOn <= to),
    overdue: tasks.filter((t) => open(t) && t.dueOn < from),
    attention: { tasks: tasks.filter((t) => open(t) && t.dueOn <= today), settings },
    pendingReview,
  };
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
    const agenda = await agendaOf(tx, actor, farmId, from, to, clock.today, q.include);
    const { pendingReview } = agenda;
    const presented = await presentWithAttention(tx, actor.coopId, [agenda.inRange, agenda.overdue], agenda.attention, clock.today);
    const [tasks, late] = presented.lists;
    const { attention } = presented;
    return {
      farm: { id: farmId, name: clock.name },
      timeZone: clock.timeZone,
      today: clock.today,
      from,
      to,
      tasks: tasks!,
      overdue: late!,
      attention,
      pendingReview,
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
    const agenda = await agendaOf(tx, actor, farmId, clock.today, weekEnd, clock.today, 'open');
    const { pendingReview } = agenda;
    const both = await presentWithAttention(tx, actor.coopId, [agenda.inRange, agenda.overdue], agenda.attention, clock.today);
    const [presented, late] = both.lists;
    const { attention } = both;
    return {
      farm: { id: farmId, name: clock.name },
      today: clock.today,
      weekEnd,
      dueToday: presented!.filter((t) => t.dueOn === clock.today),
      thisWeek: presented!.filter((t) => t.dueOn > clock.today),
      overdue: late!,
      attention,
      pendingReview,
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
