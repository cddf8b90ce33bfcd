import { useState } from 'react';
import { Check, ChevronDown, ChevronUp, RotateCcw } from 'lucide-react';
import { Link } from 'react-router-dom';
import { countOf, taskUpdateSchema, type AlmanacTaskDto, type TaskUpdateInput } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { useReviewTask } from '../api/review-task';
import { useUpdateTask } from '../api/update-task';
import { formatDate, formatWeekdayDay } from '../../../lib/days';
import { errorText } from '../../../lib/form-errors';
import type { ServerMutateOptions } from '../../../lib/use-server-submit';
import { useMyApprentices } from '../../mentorship';
import { useAlmanacRights } from '../hooks/use-almanac-rights';
import { isOpen, taskStatus } from '../task-labels';
import { TaskActionForm } from './task-action-form';

interface TaskItemProps {
  task: AlmanacTaskDto;
  /** Bulk selection (the agenda); absent where tasks are shown one by one. */
  selected?: boolean;
  onSelect?: (selected: boolean) => void;
  /** Show the date (lists not grouped by day). */
  showDate?: boolean;
  /** Link to the service or litter the task came from. */
  showSource?: boolean;
}

function sourceLink(task: AlmanacTaskDto): { to: string; label: string } | null {
  if (task.litterId) return { to: `/litters/${task.litterId}`, label: 'Litter' };
  if (task.serviceId) return { to: `/almanac/services/${task.serviceId}`, label: 'Service' };
  return null;
}

/** One task: tick it done, or (members) move it to another day or skip it with a reason. */
export function TaskItem({ task, selected, onSelect, showDate = false, showSource = true }: TaskItemProps) {
  const rights = useAlmanacRights();
  const myApprentices = useMyApprentices();
  const update = useUpdateTask();
  const review = useReviewTask();
  const [more, setMore] = useState(false);
  const status = taskStatus(task);
  const open = isOpen(task);
  const source = showSource ? sourceLink(task) : null;
  const act = (input: TaskUpdateInput, options?: ServerMutateOptions<unknown>) =>
    update.mutate({ taskId: task.id, input }, { ...options, onSuccess: (result) => { setMore(false); options?.onSuccess?.(result); } });
  const error = update.error ?? review.error;

  return (
    <li className={cn('rounded-xl border bg-white p-3 sm:p-4', task.timing === 'overdue' && open ? 'border-clay/50' : 'border-grey-200')} data-task-id={task.id}>
      <div className="flex items-start gap-3">
        {onSelect && open && (
          <input
            type="checkbox"
            className="mt-2.5 size-6 shrink-0 cursor-pointer accent-moss"
            checked={selected ?? false}
            onChange={(e) => onSelect(e.target.checked)}
            aria-label={`Select ${task.title} ${task.subject}`}
          />
        )}
        <div className="min-w-0 flex-1 space-y-1">
          <p className={cn('font-semibold', task.state === 'skipped' && 'text-grey-500 line-through')}>
            {task.title}
            {task.subject && <span className="font-normal text-grey-700"> · {task.subject}</span>}
          </p>
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-grey-600">
            {showDate && <span>{formatWeekdayDay(task.dueOn)}</span>}
            <Badge tone={status.tone}>{status.label}</Badge>
            {task.kind === 'kindling_due' && task.windowStart && (
              <span>
                window {formatDate(task.windowStart)} – {formatDate(task.windowEnd!)}
              </span>
            )}
            {task.kind === 'quarantine_end' && task.windowStart && <span>isolated from {formatDate(task.windowStart)}</span>}
            {task.ageDays !== null && <span>kits {countOf(task.ageDays, 'day')} old</span>}
            {task.state === 'moved' && task.movedFrom && <span>moved from {formatDate(task.movedFrom)}</span>}
            {task.state === 'done' && task.doneOn && (
              <span>
                done {formatDate(task.doneOn)}
                {task.doneBy ? ` by ${task.doneBy.name}` : ''}
              </span>
            )}
            {task.stateReason && task.state !== 'done' && <span>{task.stateReason}</span>}
            {source && (
              <Link to={source.to} className="inline-flex min-h-11 items-center font-medium text-moss-deep underline underline-offset-4 sm:min-h-0">
                {source.label}
              </Link>
            )}
          </div>
          {task.reviewComment && <p className="text-sm text-clay-deep">Mentor: {task.reviewComment}</p>}
        </div>
        <div className="flex shrink-0 flex-wrap justify-end gap-2">
          {open && rights.canTick && (
            <Button variant="secondary" className="px-3" isBusy={update.isPending} onClick={() => act({ action: 'done', version: task.version })} aria-label={`Done: ${task.title} ${task.subject}`}>
              <Check className="size-5" aria-hidden="true" />
              <span className="hidden sm:inline">Done</span>
            </Button>
          )}
          {open && rights.canPlan && (
            <Button variant="quiet" className="px-2" onClick={() => setMore(!more)} aria-expanded={more} aria-label={`Move or skip: ${task.title} ${task.subject}`}>
              {more ? <ChevronUp className="size-5" aria-hidden="true" /> : <ChevronDown className="size-5" aria-hidden="true" />}
            </Button>
          )}
          {!open && rights.canPlan && task.completionReview !== 'pending' && (
            <Button variant="quiet" className="px-2" onClick={() => act({ action: 'reopen', version: task.version })} aria-label={`Reopen: ${task.title} ${task.subject}`}>
              <RotateCcw className="size-5" aria-hidden="true" />
            </Button>
          )}
          {task.completionReview === 'pending' && rights.canReview && myApprentices.includes(task.doneBy?.id) && (
            <>
              <Button variant="secondary" className="px-3" isBusy={review.isPending} onClick={() => review.mutate({ taskId: task.id, input: { decision: 'accepted', version: task.version } })}>
                Accept
              </Button>
              <Button variant="quiet" className="px-3" onClick={() => review.mutate({ taskId: task.id, input: { decision: 'returned', comment: 'Please do it again', version: task.version } })}>
                Return
              </Button>
            </>
          )}
        </div>
      </div>
      {more && (
        <div className="mt-3 grid gap-3 border-t border-grey-200 pt-3 sm:grid-cols-2">
          <TaskActionForm
            field={{ name: 'dueOn', label: 'Move to', type: 'date', min: task.anchorDate, initial: task.dueOn }}
            button="Move"
            toBody={(dueOn): TaskUpdateInput => ({ action: 'move', dueOn, version: task.version })}
            schema={taskUpdateSchema}
            send={act}
            reset={update.reset}
            error={update.error}
          />
          <TaskActionForm
            field={{ name: 'reason', label: 'Skip, because…', initial: '' }}
            button="Skip"
            toBody={(reason): TaskUpdateInput => ({ action: 'skip', reason, version: task.version })}
            schema={taskUpdateSchema}
            send={act}
            reset={update.reset}
            error={update.error}
          />
        </div>
      )}
      {error && (
        <p role="alert" className="mt-2 text-sm font-medium text-clay-deep">
          {errorText(error)}
        </p>
      )}
    </li>
  );
}
