import { useState } from 'react';
import type { AlmanacTaskDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { useBulkUpdateTasks } from '../api/bulk-update-tasks';
import { errorText } from '../../../lib/form-errors';

/** Done, moved or skipped at once for the selected tasks (all or none). */
export function BulkBar({ tasks, today, onDone }: { tasks: AlmanacTaskDto[]; today: string; onDone: () => void }) {
  const bulk = useBulkUpdateTasks();
  const [moveTo, setMoveTo] = useState(today);
  const [reason, setReason] = useState('');
  const refs = tasks.map((t) => ({ id: t.id, version: t.version }));
  const run = (input: Parameters<typeof bulk.mutate>[0]) => bulk.mutate(input, { onSuccess: onDone });
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
        <form
          className="flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            run({ action: 'move', dueOn: moveTo, tasks: refs });
          }}
        >
          <TextField label="Move all to" type="date" value={moveTo} onChange={(e) => setMoveTo(e.target.value)} className="flex-1" />
          <Button type="submit" variant="secondary">
            Move
          </Button>
        </form>
        <form
          className="flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            run({ action: 'skip', reason, tasks: refs });
          }}
        >
          <TextField label="Skip all, because…" value={reason} onChange={(e) => setReason(e.target.value)} className="flex-1" />
          <Button type="submit" variant="secondary">
            Skip
          </Button>
        </form>
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
