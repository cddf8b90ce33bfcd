import { taskBulkSchema, type AlmanacTaskDto, type TaskBulkInput } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { useBulkUpdateTasks } from '../api/bulk-update-tasks';
import { errorText } from '../../../lib/form-errors';
import type { ServerMutateOptions } from '../../../lib/use-server-submit';
import { TaskActionForm } from './task-action-form';

/** Done, moved or skipped at once for the selected tasks (all or none). */
export function BulkBar({ tasks, today, onDone }: { tasks: AlmanacTaskDto[]; today: string; onDone: () => void }) {
  const bulk = useBulkUpdateTasks();
  const refs = tasks.map((t) => ({ id: t.id, version: t.version }));
  const run = (input: TaskBulkInput, options?: ServerMutateOptions<unknown>) => bulk.mutate(input, { ...options, onSuccess: onDone });
  return (
    <section aria-label="Selected tasks" className="sticky bottom-2 z-10 space-y-3 rounded-2xl border-2 border-moss bg-white p-4 shadow-lg">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="font-semibold">{tasks.length === 1 ? '1 task selected' : `${tasks.length} tasks selected`}</p>
        <div className="flex flex-wrap gap-2">
          <Button isBusy={bulk.isPending} onClick={() => run({ action: 'done', tasks: refs })}>
            Mark done
          </Button>
          <Button variant="quiet" onClick={onDone}>
            Clear
          </Button>
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <TaskActionForm
          field={{ name: 'dueOn', label: 'Move all to', type: 'date', initial: today }}
          button="Move"
          schema={taskBulkSchema}
          toBody={(dueOn): TaskBulkInput => ({ action: 'move', dueOn, tasks: refs })}
          send={run}
          reset={bulk.reset}
          error={bulk.error}
        />
        <TaskActionForm
          field={{ name: 'reason', label: 'Skip all, because…', initial: '' }}
          button="Skip"
          schema={taskBulkSchema}
          toBody={(reason): TaskBulkInput => ({ action: 'skip', reason, tasks: refs })}
          send={run}
          reset={bulk.reset}
          error={bulk.error}
        />
      </div>
      {bulk.isError && (
        <p role="alert" className="text-sm font-medium text-clay-deep">
          {bulk.error.message === 'Someone else saved a change to this record first. Reload to see it, then make your change again.'
            ? 'One of these tasks was changed meanwhile; nothing was saved. The list is up to date now: try again.'
            : errorText(bulk.error)}
        </p>
      )}
    </section>
  );
}
