import { CalendarDays, Sun } from 'lucide-react';
import type { AlmanacTaskDto } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { Spinner } from '../../../components/ui/spinner';
import { useAlmanacSummary } from '../api/get-almanac-summary';
import { formatLongDay, relativeDay } from '../../../lib/days';
import { AttentionList } from './attention-list';
import { TaskItem } from './task-item';

function TaskList({ tasks, empty, showDate = false }: { tasks: AlmanacTaskDto[]; empty: string; showDate?: boolean }) {
  if (tasks.length === 0) return <p className="text-grey-600">{empty}</p>;
  return (
    <ul className="space-y-2">
      {tasks.map((t) => (
        <TaskItem key={t.id} task={t} showDate={showDate} />
      ))}
    </ul>
  );
}

/** Commons' view of the farm's Almanac: what is due today (and late), and the rest of this week. */
export function TodayCards({ enabled }: { enabled: boolean }) {
  const summary = useAlmanacSummary(enabled);
  if (!enabled) return null;
  if (!summary.data) return summary.isError ? null : <Spinner label="Loading today's tasks…" />;
  const s = summary.data;
  const byDay = new Map<string, AlmanacTaskDto[]>();
  for (const t of s.thisWeek) byDay.set(t.dueOn, [...(byDay.get(t.dueOn) ?? []), t]);
  return (
    <div className="space-y-4">
      <AttentionList items={s.attention} />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card className="space-y-4" aria-labelledby="commons-today">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="commons-today" className="flex items-center gap-2 text-xl font-bold">
              <Sun className="size-5 text-straw-deep" aria-hidden="true" />
              Today
            </h2>
            <span className="text-grey-600">{formatLongDay(s.today)}</span>
          </div>
          <LinkButton to="/herd/does" variant="secondary" className="w-full sm:w-auto">
            Doe board: the morning's round
          </LinkButton>
          <TaskList tasks={s.dueToday} empty="Nothing planned for today." />
          {s.overdue.length > 0 && (
            <div className="space-y-2">
              <h3 className="font-semibold text-clay-deep">Overdue</h3>
              <TaskList tasks={s.overdue} empty="" showDate />
            </div>
          )}
        </Card>
        <Card className="space-y-4" aria-labelledby="commons-week">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="commons-week" className="flex items-center gap-2 text-xl font-bold">
              <CalendarDays className="size-5 text-moss" aria-hidden="true" />
              This week
            </h2>
            <LinkButton to="/almanac" variant="quiet">
              Open the Almanac
            </LinkButton>
          </div>
          {s.thisWeek.length === 0 ? (
            <p className="text-grey-600">Nothing else planned until {formatLongDay(s.weekEnd)}.</p>
          ) : (
            [...byDay.entries()].map(([day, tasks]) => (
              <div key={day} className="space-y-2">
                <h3 className="font-semibold">{relativeDay(day, s.today)}</h3>
                <TaskList tasks={tasks} empty="" />
              </div>
            ))
          )}
        </Card>
      </div>
    </div>
  );
}
