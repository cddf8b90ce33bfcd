import { addDays, daysBetween } from '../herd/herd-dates';
import type { CycleSettings } from './cycle-settings';

/**
 * The Almanac's plan: the dated jobs a service, a palpation, a kindling or an arrival implies under the
 * farm's cycle settings. Pure: the server stores the tasks (with their own ids) and passes them back here
 * to re-plan. Dates are `YYYY-MM-DD` calendar dates in the farm's time zone; day arithmetic is done on
 * the date alone (herd/herd-dates), so no clock or time zone ever moves a task by a day.
 */

export const plannedTaskKinds = [
  'palpation',
  'nest_box_in',
  'kindling_due',
  'kindling_overdue',
  'rebreed',
  'nest_box_out',
  'weigh_in',
  'weaning',
  'breed_back',
  'quarantine_end',
] as const;
export type PlannedTaskKind = (typeof plannedTaskKinds)[number];

/** What a task's date is counted from. */
export type TaskAnchor = 'service' | 'palpation' | 'kindling' | 'arrival';

export const taskStates = ['open', 'done', 'moved', 'skipped'] as const;
export type TaskState = (typeof taskStates)[number];

/** Short labels in the product's own words (the screen may add the doe's name). */
export const TASK_KIND_LABELS: Readonly<Record<PlannedTaskKind, string>> = Object.freeze({
  palpation: 'Palpate',
  nest_box_in: 'Nest box in',
  kindling_due: 'Kindling due',
  kindling_overdue: 'If no kits by now: check the doe',
  rebreed: 'Rebreed',
  nest_box_out: 'Nest box out',
  weigh_in: 'Weigh the litter',
  weaning: 'Wean',
  breed_back: 'Breed back',
  quarantine_end: 'Quarantine ends',
});

export interface PlannedTask {
  kind: PlannedTaskKind;
  /**
   * Stable within the record it came from: the kind, or `weigh_in:<age>` for weigh-ins. The server keeps
   * (source id, key) unique so planning the same record twice never doubles a task.
   */
  key: string;
  anchor: TaskAnchor;
  anchorDate: string;
  /** Days from the anchor date to the due date. */
  offsetDays: number;
  dueOn: string;
  /** The kindling window (kindling_due only). */
  windowStart?: string;
  windowEnd?: string;
  /** The litter's age at a weigh-in (weigh_in only). */
  ageDays?: number;
}

function task(kind: PlannedTaskKind, anchor: TaskAnchor, anchorDate: string, offsetDays: number, key: string = kind): PlannedTask {
  return { kind, key, anchor, anchorDate, offsetDays, dueOn: addDays(anchorDate, offsetDays) };
}

/** Service → palpation, nest box in, kindling due (with its window) and the overdue kindling alert. */
export function planFromService(serviceDate: string, settings: CycleSettings): PlannedTask[] {
  const kindling = task('kindling_due', 'service', serviceDate, settings.kindlingExpectedDays);
  kindling.windowStart = addDays(serviceDate, settings.kindlingWindowStartDays);
  kindling.windowEnd = addDays(serviceDate, settings.kindlingWindowEndDays);
  return [
    task('palpation', 'service', serviceDate, settings.palpationDays),
    task('nest_box_in', 'service', serviceDate, settings.nestBoxInDays),
    kindling,
    task('kindling_overdue', 'service', serviceDate, settings.kindlingOverdueDays),
  ];
}

export type PalpationResult = 'positive' | 'negative';

export interface PalpationPlan {
  /** New tasks from the palpation (the rebreed after a negative one). */
  tasks: PlannedTask[];
  /** The service's open tasks that no longer apply, to be skipped with `skipReason`. */
  skipKinds: PlannedTaskKind[];
  skipReason: string | null;
}

/**
 * A positive palpation keeps the service's plan; a negative one plans the rebreed and retires the nest
 * box and kindling tasks (skipped with a reason, so the breeder sees why they went).
 */
export function planAfterPalpation(result: PalpationResult, palpationDate: string, settings: CycleSettings): PalpationPlan {
  if (result === 'positive') return { tasks: [], skipKinds: [], skipReason: null };
  return {
    tasks: [task('rebreed', 'palpation', palpationDate, settings.rebreedAfterNegativeDays)],
    skipKinds: ['nest_box_in', 'kindling_due', 'kindling_overdue'],
    skipReason: `Palpated empty on ${palpationDate}`,
  };
}

/**
 * Kindling → nest box out, a weigh-in at each of the farm's ages, weaning and breeding back, all counted
 * from the real kindling date (never from the date the service predicted).
 */
export function planFromKindling(kindlingDate: string, settings: CycleSettings): PlannedTask[] {
  const weighIns = settings.weighInAgesDays.map((age) => {
    const t = task('weigh_in', 'kindling', kindlingDate, age, `weigh_in:${age}`);
    t.ageDays = age;
    return t;
  });
  const tasks = [
    task('nest_box_out', 'kindling', kindlingDate, settings.nestBoxOutDays),
    ...weighIns,
    task('weaning', 'kindling', kindlingDate, settings.weaningDays),
    task('breed_back', 'kindling', kindlingDate, settings.breedBackDays),
  ];
  return tasks.sort((a, b) => a.offsetDays - b.offsetDays || a.key.localeCompare(b.key));
}

/** An arrival (bought, traded, back from a loan) → the end of its quarantine under the co-op's rule. */
export function planQuarantine(arrivalDate: string, quarantineDays: number): PlannedTask[] {
  if (!Number.isInteger(quarantineDays) || quarantineDays < 0) throw new RangeError('Quarantine days must be a whole number, 0 or more');
  if (quarantineDays === 0) return [];
  return [task('quarantine_end', 'arrival', arrivalDate, quarantineDays)];
}

/** A stored task, as the server passes it back for re-planning and for the surfacing checks. */
export interface TaskRecord {
  id: string;
  /** The service, palpation, litter or arrival the task came from. */
  sourceId: string;
  kind: PlannedTaskKind;
  key: string;
  anchor: TaskAnchor;
  anchorDate: string;
  dueOn: string;
  state: TaskState;
  windowStart?: string | null;
  windowEnd?: string | null;
  /** The doe (or the litter's dam) the task is about, when it names one. */
  animalId?: string | null;
}

export interface TaskChange {
  id: string;
  previousDueOn: string;
  dueOn: string;
  windowStart?: string;
  windowEnd?: string;
}

export interface TaskSkip {
  id: string;
  reason: string;
}

export interface ReplanResult {
  /** Open tasks whose date changes. */
  changed: TaskChange[];
  /** Open tasks the new settings no longer plan (a weigh-in age taken out), to be skipped with the reason. */
  skipped: TaskSkip[];
  /** Tasks the new settings add (a new weigh-in age) for a record that still has open tasks. */
  added: (PlannedTask & { sourceId: string })[];
}

function planFor(anchor: TaskAnchor, anchorDate: string, settings: CycleSettings): PlannedTask[] {
  switch (anchor) {
    case 'service':
      return planFromService(anchorDate, settings);
    case 'palpation':
      return planAfterPalpation('negative', anchorDate, settings).tasks;
    case 'kindling':
      return planFromKindling(anchorDate, settings);
    case 'arrival':
      return []; // the quarantine rule is the co-op's, not a cycle setting
  }
}

/**
 * New cycle settings re-plan the open tasks only: done and skipped tasks are history, and a task the
 * breeder moved by hand keeps the date she chose. Weigh-ins follow the new ages: an open weigh-in at an
 * age no longer listed is skipped, and a newly listed age is added when its date is not yet past
 * (`today`), for records that still have open tasks.
 */
export function replanOpenTasks(tasks: ReadonlyArray<TaskRecord>, settings: CycleSettings, today: string): ReplanResult {
  const result: ReplanResult = { changed: [], skipped: [], added: [] };
  const bySource = new Map<string, TaskRecord[]>();
  for (const t of tasks) {
    const group = bySource.get(t.sourceId) ?? [];
    group.push(t);
    bySource.set(t.sourceId, group);
  }
  for (const [sourceId, group] of bySource) {
    const anchors = new Set(group.map((t) => `${t.anchor}@${t.anchorDate}`));
    for (const anchorKey of anchors) {
      const [anchor, anchorDate] = anchorKey.split('@') as [TaskAnchor, string];
      if (anchor === 'arrival') continue;
      const mine = group.filter((t) => t.anchor === anchor && t.anchorDate === anchorDate);
      const planned = new Map(planFor(anchor, anchorDate, settings).map((p) => [p.key, p]));
      for (const t of mine) {
        if (t.state !== 'open') continue;
        const p = planned.get(t.key);
        if (!p) {
          result.skipped.push({ id: t.id, reason: 'No longer in the farm\'s cycle settings' });
          continue;
        }
        const windowMoved = p.windowStart !== undefined && (p.windowStart !== t.windowStart || p.windowEnd !== t.windowEnd);
        if (p.dueOn !== t.dueOn || windowMoved) {
          const change: TaskChange = { id: t.id, previousDueOn: t.dueOn, dueOn: p.dueOn };
          if (p.windowStart !== undefined) {
            change.windowStart = p.windowStart;
            change.windowEnd = p.windowEnd!;
          }
          result.changed.push(change);
        }
      }
      const hasOpen = mine.some((t) => t.state === 'open' || t.state === 'moved');
      if (!hasOpen) continue;
      const known = new Set(mine.map((t) => t.key));
      for (const p of planned.values()) {
        if (p.kind === 'weigh_in' && !known.has(p.key) && p.dueOn >= today) result.added.push({ ...p, sourceId });
      }
    }
  }
  return result;
}

export interface KindlingSettlement {
  /** Service tasks to mark done by the kindling (kindling due, and the nest box when it was in). */
  done: string[];
  /** Service tasks the kindling makes pointless, with the reason. */
  skipped: TaskSkip[];
}

/**
 * What a recorded kindling does to its service's open (or moved) tasks: the kindling task is done; the
 * overdue alert, a palpation not yet done and a nest box not yet ticked are skipped with the reason, since
 * the kits are born and none of them can still be late.
 */
export function settleServiceTasksOnKindling(serviceTasks: ReadonlyArray<TaskRecord>, kindlingDate: string): KindlingSettlement {
  const out: KindlingSettlement = { done: [], skipped: [] };
  for (const t of serviceTasks) {
    if (t.anchor !== 'service' || (t.state !== 'open' && t.state !== 'moved')) continue;
    const day = daysBetween(t.anchorDate, kindlingDate);
    if (t.kind === 'kindling_due') out.done.push(t.id);
    else if (t.kind === 'kindling_overdue') out.skipped.push({ id: t.id, reason: `Kindled on day ${day}` });
    else if (t.kind === 'palpation') out.skipped.push({ id: t.id, reason: `Kindled on day ${day} before a palpation was recorded` });
    else if (t.kind === 'nest_box_in') {
      const reason = kindlingDate < t.dueOn ? `Kindled on day ${day}, before the nest box was due` : `Kindled on day ${day}; the nest box task closes with the kindling`;
      out.skipped.push({ id: t.id, reason });
    }
  }
  return out;
}

export type KindlingStatus = 'not_due' | 'in_window' | 'overdue' | 'missed';

/**
 * Where an unkindled service stands on `today`: before the window opens → not_due; from the window's
 * first day until the overdue alert → in_window; from the overdue alert to the window's last day →
 * overdue; after the window → missed (Merck Veterinary Manual: gestation 29–35 d, no kits by day 32 →
 * watch; with the default settings).
 */
export function kindlingStatus(serviceDate: string, today: string, settings: CycleSettings): KindlingStatus {
  const day = daysBetween(serviceDate, today);
  if (day < settings.kindlingWindowStartDays) return 'not_due';
  if (day < settings.kindlingOverdueDays) return 'in_window';
  if (day <= settings.kindlingWindowEndDays) return 'overdue';
  return 'missed';
}

export type TaskTiming = 'done' | 'skipped' | 'upcoming' | 'due_today' | 'overdue';

/** How a task stands on `today` (a moved task counts like an open one on its new date). */
export function taskTiming(task: Pick<TaskRecord, 'state' | 'dueOn'>, today: string): { timing: TaskTiming; daysLate: number } {
  if (task.state === 'done') return { timing: 'done', daysLate: 0 };
  if (task.state === 'skipped') return { timing: 'skipped', daysLate: 0 };
  const late = daysBetween(task.dueOn, today);
  if (late < 0) return { timing: 'upcoming', daysLate: 0 };
  if (late === 0) return { timing: 'due_today', daysLate: 0 };
  return { timing: 'overdue', daysLate: late };
}

export type AttentionKind = 'missed_palpation' | 'kindling_overdue' | 'kindling_missed' | 'late_weaning' | 'overdue_task';

export interface TaskAttention {
  taskId: string;
  sourceId: string;
  kind: AttentionKind;
  taskKind: PlannedTaskKind;
  daysLate: number;
  message: string;
  /** The doe it is about, named and linked by the banner (when the caller knows her). */
  doe?: AttentionDoe;
}

export interface AttentionDoe {
  id: string;
  name: string;
  tattoo: string | null;
}

/** "Clover (HR-2)", or whichever of name and tattoo the doe has. */
export function doeLabel(doe: Pick<AttentionDoe, 'name' | 'tattoo'>): string {
  if (doe.name && doe.tattoo) return `${doe.name} (${doe.tattoo})`;
  return doe.name || doe.tattoo || 'The doe';
}

/**
 * What must surface by itself on Commons and in the morning e-mail: palpations not done by their day,
 * kindlings overdue or past the window, weanings late, and any other open task past its date. Most late
 * first. The kindling check reads the service date, so it holds even if nobody opened the Almanac.
 */
export function needsAttention(
  tasks: ReadonlyArray<TaskRecord>,
  today: string,
  settings: CycleSettings,
  does?: ReadonlyMap<string, AttentionDoe>,
): TaskAttention[] {
  const out: TaskAttention[] = [];
  for (const t of tasks) {
    if (t.state === 'done' || t.state === 'skipped') continue;
    if (t.kind === 'kindling_overdue') continue; // the kindling_due task carries the alert
    const { daysLate } = taskTiming(t, today);
    const doe = t.animalId ? does?.get(t.animalId) : undefined;
    const base = { taskId: t.id, sourceId: t.sourceId, taskKind: t.kind, ...(doe ? { doe } : {}) };
    // Named, the message says whose; unnamed (no doe given) it reads as before.
    const whose = doe ? `${doeLabel(doe)}: ` : '';
    if (t.kind === 'kindling_due') {
      const status = kindlingStatus(t.anchorDate, today, settings);
      const day = daysBetween(t.anchorDate, today);
      if (status === 'overdue') {
        const message = doe
          ? `${whose}day ${day} after service and no kits recorded: check her; the vet may induce`
          : `Day ${day} after service and no kits recorded: check the doe; the vet may induce`;
        out.push({ ...base, kind: 'kindling_overdue', daysLate: Math.max(daysLate, 0), message });
      } else if (status === 'missed') {
        const message = `${doe ? `${whose}day` : 'Day'} ${day} after service, past the kindling window: record the kindling or close the service as missed`;
        out.push({ ...base, kind: 'kindling_missed', daysLate: Math.max(daysLate, 0), message });
      }
      continue;
    }
    if (daysLate <= 0) continue;
    const days = daysLate === 1 ? '1 day' : `${daysLate} days`;
    if (t.kind === 'palpation') out.push({ ...base, kind: 'missed_palpation', daysLate, message: `${whose}Palpation ${days} late` });
    else if (t.kind === 'weaning') out.push({ ...base, kind: 'late_weaning', daysLate, message: `${whose}Weaning ${days} late` });
    else out.push({ ...base, kind: 'overdue_task', daysLate, message: `${whose}${TASK_KIND_LABELS[t.kind]}: ${days} late` });
  }
  return out.sort((a, b) => b.daysLate - a.daysLate || a.taskId.localeCompare(b.taskId));
}
