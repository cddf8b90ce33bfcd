import { z } from 'zod';
import { multiLine, singleLine, recordId } from './text';
import { isIsoDate } from '../herd/herd-dates';
import { calendarDateSchema } from './animal.schema';
import { pageSchema, pageSizeSchema } from './application.schema';

/**
 * Inputs of the Almanac: services and palpations, closing a service, treatments, task
 * actions one by one or in bulk, the agenda's date range, the morning e-mail. Dates are calendar dates
 * on the farm's own clock; whether one lies in the future is checked by the server against the farm's
 * today (the schema cannot know the farm's time zone).
 */

const noteText = (max: number) => multiLine(max);

/** A service: the doe, the buck (the farm's own or one kept here on loan), the date. */
export const serviceCreateSchema = z.strictObject({
  /** Client-generated, so a retried save cannot record the service twice. */
  id: recordId('The service').optional(),
  doeId: recordId('The doe'),
  buckId: recordId('The buck'),
  servicedOn: calendarDateSchema,
  notes: noteText(1000).default(''),
  /** Set on a resubmit after a warning (a young doe, a doe under treatment), to save anyway. */
  confirm: z.boolean().optional(),
});
export type ServiceCreateInput = z.infer<typeof serviceCreateSchema>;
export type ServiceCreateBody = z.input<typeof serviceCreateSchema>;

export const palpationResults = ['positive', 'negative'] as const;

export const palpationCreateSchema = z.strictObject({
  palpatedOn: calendarDateSchema,
  result: z.enum(palpationResults, { message: 'Did you feel kits? Choose positive or negative' }),
  notes: noteText(500).default(''),
  confirm: z.boolean().optional(),
});
export type PalpationCreateInput = z.infer<typeof palpationCreateSchema>;

/** Closing a service with no kindling (she did not kindle; the window passed). */
export const serviceClosureSchema = z.strictObject({
  closedOn: calendarDateSchema,
  reason: singleLine('The reason', 0, 200).refine((v) => v.length > 0, 'Say why the service is closed'),
  version: z.number().int().min(0),
});
export type ServiceClosureInput = z.infer<typeof serviceClosureSchema>;

export const serviceSortKeys = ['servicedOn'] as const;

/** GET /api/services: the farm's services (or one doe's), filtered and paged on the server, latest first by default. */
export const serviceListQuerySchema = z.strictObject({
  status: z.enum(['open', 'closed', 'all'], { message: 'Choose open, closed or all' }).default('all'),
  doeId: recordId('The doe').optional(),
  sort: z.enum(serviceSortKeys, { message: 'Not a column the services sort by' }).default('servicedOn'),
  dir: z.enum(['asc', 'desc'], { message: 'Choose asc or desc' }).default('desc'),
  page: pageSchema,
  pageSize: pageSizeSchema,
});
export type ServiceListQuery = z.infer<typeof serviceListQuerySchema>;

/** Treatments moved to schemas/health.schema.ts (dose, route, withdrawal, groups). */

/** GET /api/almanac/tasks: a window of the agenda or of a month, on the farm's clock. */
export const agendaQuerySchema = z
  .strictObject({
    from: calendarDateSchema.optional(),
    to: calendarDateSchema.optional(),
    /** Without `to`: this many days from `from` (today by default). */
    days: z.coerce.number().int().min(1).max(62).optional(),
    /** Done and skipped tasks too (the month view shows what happened). */
    include: z.enum(['open', 'all']).default('all'),
  })
  .superRefine((v, ctx) => {
    if (v.from && v.to && isIsoDate(v.from) && isIsoDate(v.to)) {
      if (v.to < v.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The end comes before the start' });
      const days = (Date.parse(v.to) - Date.parse(v.from)) / 86_400_000;
      if (days > 62) ctx.addIssue({ code: 'custom', path: ['to'], message: 'Ask for at most 62 days at a time' });
    }
  });
export type AgendaQuery = z.infer<typeof agendaQuerySchema>;

const version = z.number({ message: 'Send the version you saw' }).int().min(0);

const taskActions = {
  done: z.strictObject({ action: z.literal('done'), doneOn: calendarDateSchema.optional(), note: noteText(500).optional() }),
  move: z.strictObject({ action: z.literal('move'), dueOn: calendarDateSchema, reason: noteText(200).optional() }),
  skip: z.strictObject({
    action: z.literal('skip'),
    reason: singleLine('The reason', 0, 200).refine((v) => v.length > 0, 'Say why you skip it'),
  }),
  reopen: z.strictObject({ action: z.literal('reopen') }),
};
const actionMessage = { message: 'Choose done, move, skip or reopen' };

/** One task ticked off, moved to another day, skipped with a reason, or opened again, from the version seen. */
export const taskUpdateSchema = z.discriminatedUnion(
  'action',
  [
    taskActions.done.extend({ version }),
    taskActions.move.extend({ version }),
    taskActions.skip.extend({ version }),
    taskActions.reopen.extend({ version }),
  ],
  actionMessage,
);
export type TaskUpdateInput = z.infer<typeof taskUpdateSchema>;
export type TaskAction = TaskUpdateInput['action'];

const bulkTasks = z
  .array(z.strictObject({ id: recordId('The task'), version }), { message: 'Choose the tasks' })
  .min(1, 'Choose at least one task')
  .max(200, 'At most 200 tasks at once')
  .refine((list) => new Set(list.map((t) => t.id)).size === list.length, 'A task is listed twice');

/** Several tasks at once, all or none: each with the version it was seen at. */
export const taskBulkSchema = z.discriminatedUnion(
  'action',
  [
    taskActions.done.extend({ tasks: bulkTasks }),
    taskActions.move.extend({ tasks: bulkTasks }),
    taskActions.skip.extend({ tasks: bulkTasks }),
    taskActions.reopen.extend({ tasks: bulkTasks }),
  ],
  actionMessage,
);
export type TaskBulkInput = z.infer<typeof taskBulkSchema>;

/** The opt-in morning e-mail of the day's tasks and anything overdue, at an hour of the farm's clock. */
export const digestPreferenceSchema = z.strictObject({
  enabled: z.boolean(),
  hour: z.number({ message: 'Choose an hour' }).int().min(3, 'From 3 am').max(11, 'By 11 am at the latest').default(6),
});
export type DigestPreferenceInput = z.infer<typeof digestPreferenceSchema>;
