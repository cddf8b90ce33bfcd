import { describe, expect, it } from 'vitest';
import { defaultCycleSettings, DEFAULT_CYCLE_SETTINGS } from './cycle-settings';
import {
  needsAttention, planAfterPalpation, planFromKindling, planFromService, planQuarantine, replanOpenTasks, settleServiceTasksOnKindling,
  taskTiming, type TaskRecord,
} from './plan';

function stored(tasks: ReturnType<typeof planFromService>, sourceId: string, state: TaskRecord['state'] = 'open'): TaskRecord[] {
  return tasks.map((t, i) => ({ ...t, id: `${sourceId}-${i}`, sourceId, state }));
}

describe('planning', () => {
  it('when a service is planned, then every task has a stable key and the kindling its window', () => {
    const tasks = planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS);
    expect(tasks.map((t) => t.key)).toEqual(['palpation', 'nest_box_in', 'kindling_due', 'kindling_overdue']);
    expect(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS)).toEqual(tasks);
    expect(tasks.every((t) => t.anchor === 'service' && t.anchorDate === '2026-03-02')).toBe(true);
  });

  it('when a palpation is negative, then a rebreed is planned the next day and the nest box and kindling tasks are retired', () => {
    const plan = planAfterPalpation('negative', '2026-03-14', DEFAULT_CYCLE_SETTINGS);
    expect(plan.tasks).toMatchObject([{ kind: 'rebreed', dueOn: '2026-03-15', anchor: 'palpation' }]);
    expect(plan.skipKinds).toEqual(['nest_box_in', 'kindling_due', 'kindling_overdue']);
    expect(plan.skipReason).toBe('Palpated empty on 2026-03-14');
  });

  it('when a palpation is positive, then nothing changes', () => {
    expect(planAfterPalpation('positive', '2026-03-14', DEFAULT_CYCLE_SETTINGS)).toEqual({ tasks: [], skipKinds: [], skipReason: null });
  });

  it('when a kindling is planned, then the tasks come in date order with weigh-ins keyed by age', () => {
    const tasks = planFromKindling('2026-04-02', DEFAULT_CYCLE_SETTINGS);
    expect(tasks.map((t) => t.offsetDays)).toEqual([...tasks.map((t) => t.offsetDays)].sort((a, b) => a - b));
    expect(tasks.filter((t) => t.kind === 'weigh_in').map((t) => [t.key, t.ageDays])).toEqual([
      ['weigh_in:28', 28], ['weigh_in:42', 42], ['weigh_in:56', 56], ['weigh_in:70', 70],
    ]);
  });

  it('when an animal arrives under a 30-day quarantine, then its end is planned; 0 days plans nothing; a negative rule is refused', () => {
    expect(planQuarantine('2026-05-01', 30)).toMatchObject([{ kind: 'quarantine_end', dueOn: '2026-05-31' }]);
    expect(planQuarantine('2026-05-01', 0)).toEqual([]);
    expect(() => planQuarantine('2026-05-01', -1)).toThrow(RangeError);
    expect(() => planQuarantine('2026-05-01', 1.5)).toThrow(RangeError);
  });

  it('when a date is not a calendar date, then planning refuses it', () => {
    expect(() => planFromService('2026-3-2', DEFAULT_CYCLE_SETTINGS)).toThrow(RangeError);
  });
});

describe('re-planning on new settings', () => {
  it('when the palpation day changes, then open tasks move, done and skipped ones stay, and a moved one keeps its date', () => {
    const tasks = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1');
    tasks[1]!.state = 'done'; // nest box in
    tasks[3]!.state = 'moved'; // overdue alert, moved by hand
    const result = replanOpenTasks(tasks, { ...defaultCycleSettings(), palpationDays: 14, nestBoxInDays: 27, kindlingOverdueDays: 33 }, '2026-03-05');
    expect(result.changed).toEqual([{ id: 's1-0', previousDueOn: '2026-03-14', dueOn: '2026-03-16' }]);
    expect(result.skipped).toEqual([]);
    expect(result.added).toEqual([]);
  });

  it('when the kindling window changes, then the open kindling task gets its new window', () => {
    const tasks = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1');
    const result = replanOpenTasks(tasks, { ...defaultCycleSettings(), kindlingWindowEndDays: 34 }, '2026-03-05');
    expect(result.changed).toEqual([{ id: 's1-2', previousDueOn: '2026-04-02', dueOn: '2026-04-02', windowStart: '2026-03-31', windowEnd: '2026-04-05' }]);
  });

  it('when nothing changes, then nothing is re-planned', () => {
    const tasks = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1');
    expect(replanOpenTasks(tasks, defaultCycleSettings(), '2026-03-05')).toEqual({ changed: [], skipped: [], added: [] });
  });

  it('when the weigh-in ages change, then an age taken out is skipped and a new future age is added, but not a past one', () => {
    const tasks = stored(planFromKindling('2026-04-02', DEFAULT_CYCLE_SETTINGS), 'l1');
    const result = replanOpenTasks(tasks, { ...defaultCycleSettings(), weighInAgesDays: [21, 28, 49, 56] }, '2026-04-25');
    const byKey = Object.fromEntries(tasks.map((t) => [t.id, t.key]));
    expect(result.skipped.map((s) => byKey[s.id])).toEqual(['weigh_in:42', 'weigh_in:70']);
    expect(result.skipped[0]!.reason).toBe('No longer in the farm\'s cycle settings');
    expect(result.added.map((t) => [t.key, t.dueOn, t.sourceId])).toEqual([['weigh_in:49', '2026-05-21', 'l1']]); // day 21 (2026-04-23) is past
  });

  it('when every task of a litter is done, then new weigh-in ages add nothing to it', () => {
    const tasks = stored(planFromKindling('2026-04-02', DEFAULT_CYCLE_SETTINGS), 'l1', 'done');
    expect(replanOpenTasks(tasks, { ...defaultCycleSettings(), weighInAgesDays: [28, 42, 84] }, '2026-04-03').added).toEqual([]);
  });

  it('when a rebreed task is open and the rebreed delay changes, then it moves from its palpation date', () => {
    const rebreed = planAfterPalpation('negative', '2026-03-14', DEFAULT_CYCLE_SETTINGS).tasks.map((t) => ({ ...t, id: 'r', sourceId: 'p1', state: 'open' as const }));
    expect(replanOpenTasks(rebreed, { ...defaultCycleSettings(), rebreedAfterNegativeDays: 3 }, '2026-03-14').changed).toEqual([
      { id: 'r', previousDueOn: '2026-03-15', dueOn: '2026-03-17' },
    ]);
  });
});

describe('what a kindling does to the service tasks', () => {
  it('when she kindles on day 27, before the nest box was due, then the nest box, palpation and overdue alert are skipped with reasons', () => {
    const tasks = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1');
    const result = settleServiceTasksOnKindling(tasks, '2026-03-29');
    expect(result.done).toEqual(['s1-2']);
    expect(result.skipped).toEqual([
      { id: 's1-0', reason: 'Kindled on day 27 before a palpation was recorded' },
      { id: 's1-1', reason: 'Kindled on day 27, before the nest box was due' },
      { id: 's1-3', reason: 'Kindled on day 27' },
    ]);
  });

  it('when she kindles after the nest box fell due and its task is still open or was moved, then the kindling closes it too', () => {
    for (const state of ['open', 'moved'] as const) {
      const tasks = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1', state);
      const result = settleServiceTasksOnKindling(tasks, '2026-04-02');
      expect(result.done).toEqual(['s1-2']);
      expect(result.skipped).toEqual([
        { id: 's1-0', reason: 'Kindled on day 31 before a palpation was recorded' },
        { id: 's1-1', reason: 'Kindled on day 31; the nest box task closes with the kindling' },
        { id: 's1-3', reason: 'Kindled on day 31' },
      ]);
    }
  });
});

describe('tasks that surface by themselves', () => {
  const service = stored(planFromService('2026-03-02', DEFAULT_CYCLE_SETTINGS), 's1');

  it('when a task is due today, late or ahead, then its timing says so', () => {
    expect(taskTiming({ state: 'open', dueOn: '2026-03-14' }, '2026-03-14')).toEqual({ timing: 'due_today', daysLate: 0 });
    expect(taskTiming({ state: 'moved', dueOn: '2026-03-14' }, '2026-03-16')).toEqual({ timing: 'overdue', daysLate: 2 });
    expect(taskTiming({ state: 'open', dueOn: '2026-03-14' }, '2026-03-13')).toEqual({ timing: 'upcoming', daysLate: 0 });
    expect(taskTiming({ state: 'done', dueOn: '2026-03-14' }, '2026-03-20').timing).toBe('done');
  });

  it('when the palpation was not done by its day, then a missed palpation surfaces', () => {
    expect(needsAttention(service, '2026-03-16', DEFAULT_CYCLE_SETTINGS)).toEqual([
      { taskId: 's1-0', sourceId: 's1', taskKind: 'palpation', kind: 'missed_palpation', daysLate: 2, message: 'Palpation 2 days late' },
    ]);
  });

  it('when day 32 passes with no kits, then an overdue kindling surfaces; after day 35 a missed one', () => {
    const palpated = service.map((t) => (t.kind === 'palpation' || t.kind === 'nest_box_in' ? { ...t, state: 'done' as const } : t));
    expect(needsAttention(palpated, '2026-04-02', DEFAULT_CYCLE_SETTINGS)).toEqual([]);
    expect(needsAttention(palpated, '2026-04-03', DEFAULT_CYCLE_SETTINGS)).toMatchObject([{ kind: 'kindling_overdue', daysLate: 1 }]);
    expect(needsAttention(palpated, '2026-04-07', DEFAULT_CYCLE_SETTINGS)).toMatchObject([{ kind: 'kindling_missed', daysLate: 5 }]);
  });

  it('when the doe of an overdue kindling is known, then the message names her and carries her for the link', () => {
    const palpated = service.map((t) => ({ ...t, animalId: 'doe-1', ...(t.kind === 'palpation' || t.kind === 'nest_box_in' ? { state: 'done' as const } : {}) }));
    const does = new Map([['doe-1', { id: 'doe-1', name: 'Clover', tattoo: 'HR-2' }]]);
    // Serviced 2026-03-02: 2026-04-04 is day 33.
    expect(needsAttention(palpated, '2026-04-04', DEFAULT_CYCLE_SETTINGS, does)).toMatchObject([{
      kind: 'kindling_overdue', doe: { id: 'doe-1', name: 'Clover', tattoo: 'HR-2' },
      message: 'Clover (HR-2): day 33 after service and no kits recorded: check her; the vet may induce',
    }]);
  });

  it('when the weaning date passes, then a late weaning surfaces, with the 6-week weigh-in of the same day as an overdue task', () => {
    const litter = stored(planFromKindling('2026-04-02', DEFAULT_CYCLE_SETTINGS), 'l1').map((t) => (t.dueOn < '2026-05-14' ? { ...t, state: 'done' as const } : t));
    const attention = needsAttention(litter, '2026-05-17', DEFAULT_CYCLE_SETTINGS);
    expect(attention.map((a) => [a.kind, a.daysLate, a.message])).toEqual([
      ['late_weaning', 3, 'Weaning 3 days late'],
      ['overdue_task', 3, 'Weigh the litter: 3 days late'],
    ]);
  });

  it('when several tasks are late, then the latest comes first', () => {
    const litter = stored(planFromKindling('2026-04-02', DEFAULT_CYCLE_SETTINGS), 'l1');
    const attention = needsAttention(litter, '2026-05-07', DEFAULT_CYCLE_SETTINGS);
    expect(attention.map((a) => [a.taskKind, a.daysLate])).toEqual([['nest_box_out', 14], ['weigh_in', 7]]); // breed-back is due today, not late
  });
});
