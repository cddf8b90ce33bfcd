import { useState } from 'react';
import type { AgendaDto, AlmanacTaskDto } from '@burrowline/shared';
import { formatLongDay, formatWeekdayDay, relativeDay } from '../../../lib/days';
import { useAlmanacRights } from '../hooks/use-almanac-rights';
import { isOpen } from '../task-labels';
import { BulkBar } from './bulk-bar';
import { TaskItem } from './task-item';

function groupByDay(tasks: AlmanacTaskDto[]): [string, AlmanacTaskDto[]][] {
  const groups = new Map<string, AlmanacTaskDto[]>();
  for (const task of tasks) {
    const list = groups.get(task.dueOn) ?? [];
    list.push(task);
    groups.set(task.dueOn, list);
  }
  return [...groups.entries()].sort(([a], [b]) => a.localeCompare(b));
}

/** The agenda: late tasks first, then day by day; members select several to tick, move or skip at once. */
export function AgendaView({ agenda }: { agenda: AgendaDto }) {
  const rights = useAlmanacRights();
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const all = [...agenda.overdue, ...agenda.tasks];
  const selectable = rights.canPlan;
  const toggle = (id: string, on: boolean) => {
    const next = new Set(selected);
    if (on) next.add(id);
    else next.delete(id);
    setSelected(next);
  };
  const chosen = all.filter((t) => selected.has(t.id) && isOpen(t));
  const item = (task: AlmanacTaskDto, showDate = false) => (
    <TaskItem key={task.id} task={task} showDate={showDate} selected={selected.has(task.id)} onSelect={selectable ? (on) => toggle(task.id, on) : undefined} />
  );

  return (
    <div className="space-y-6">
      {agenda.overdue.length > 0 && (
        <section aria-labelledby="agenda-overdue" className="space-y-2">
          <h2 id="agenda-overdue" className="text-lg font-bold text-clay-deep">
            Overdue
          </h2>
          <ul className="space-y-2">{agenda.overdue.map((t) => item(t, true))}</ul>
        </section>
      )}
      {groupByDay(agenda.tasks).map(([day, tasks]) => (
        <section key={day} aria-labelledby={`agenda-${day}`} className="space-y-2">
          <h2 id={`agenda-${day}`} className="text-lg font-bold">
            {relativeDay(day, agenda.today)}
            {/* Today, tomorrow and yesterday get their date beside them; any other day's name is its date already. */}
            {relativeDay(day, agenda.today) !== formatWeekdayDay(day) && <span className="ml-2 text-base font-normal text-grey-600">{formatLongDay(day)}</span>}
          </h2>
          <ul className="space-y-2">{tasks.map((t) => item(t))}</ul>
        </section>
      ))}
      {all.length === 0 && (
        <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-8 text-center text-grey-600">
          Nothing planned in these days. Record a service and the Almanac plans the rest.
        </p>
      )}
      {chosen.length > 0 && <BulkBar tasks={chosen} today={agenda.today} onDone={() => setSelected(new Set())} />}
    </div>
  );
}
