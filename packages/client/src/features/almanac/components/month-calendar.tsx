import { useState } from 'react';
import { ChevronLeft, ChevronRight } from 'lucide-react';
import type { AgendaDto, AlmanacTaskDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { cn } from '../../../lib/cn';
import { formatLongDay, formatMonth, monthGrid, weekdayNames } from '../../../lib/days';
import { TaskItem } from './task-item';

const dotTone: Record<string, string> = {
  overdue: 'bg-clay',
  due_today: 'bg-straw',
  upcoming: 'bg-moss',
  done: 'bg-grey-400',
  skipped: 'bg-grey-300',
};

const chipTone: Record<string, string> = {
  overdue: 'bg-clay-wash text-clay-deep',
  due_today: 'bg-straw-wash text-bark',
  upcoming: 'bg-moss-wash text-moss-deep',
  done: 'bg-grey-100 text-grey-600',
  skipped: 'bg-grey-100 text-grey-500 line-through',
};

interface MonthCalendarProps {
  agenda: AgendaDto;
  month: string;
  onMonth: (first: string) => void;
  previous: string;
  next: string;
}

/** A month of the Almanac: each day with its tasks; choosing a day lists them below to tick off. */
export function MonthCalendar({ agenda, month, onMonth, previous, next }: MonthCalendarProps) {
  const [chosen, setChosen] = useState<string | null>(null);
  const byDay = new Map<string, AlmanacTaskDto[]>();
  for (const t of agenda.tasks) byDay.set(t.dueOn, [...(byDay.get(t.dueOn) ?? []), t]);
  const weeks = monthGrid(month);
  const day = chosen && chosen.startsWith(month.slice(0, 7)) ? chosen : null;

  return (
    <div className="space-y-4">
      <div className="flex items-center justify-between gap-3">
        <Button variant="secondary" onClick={() => onMonth(previous)} aria-label="Previous month">
          <ChevronLeft className="size-5" aria-hidden="true" />
        </Button>
        <h2 className="text-xl font-bold" aria-live="polite">
          {formatMonth(month)}
        </h2>
        <Button variant="secondary" onClick={() => onMonth(next)} aria-label="Next month">
          <ChevronRight className="size-5" aria-hidden="true" />
        </Button>
      </div>
      <table className="w-full table-fixed border-collapse overflow-hidden rounded-2xl bg-white text-left shadow-sm">
        <caption className="sr-only">Almanac for {formatMonth(month)}</caption>
        <thead>
          <tr>
            {weekdayNames.map((name) => (
              <th key={name} scope="col" className="border-b border-grey-200 px-2 py-2 text-sm font-semibold text-grey-600">
                {name}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {weeks.map((week) => (
            <tr key={week[0]}>
              {week.map((d) => {
                const tasks = byDay.get(d) ?? [];
                const inMonth = d.startsWith(month.slice(0, 7));
                const isToday = d === agenda.today;
                return (
                  <td key={d} className={cn('h-16 border border-grey-200 align-top sm:h-28', !inMonth && 'bg-grey-50 text-grey-400')}>
                    <button
                      type="button"
                      onClick={() => setChosen(d)}
                      aria-pressed={day === d}
                      aria-label={`${formatLongDay(d)}: ${tasks.length === 1 ? '1 task' : `${tasks.length} tasks`}`}
                      className={cn('flex h-full min-h-16 w-full flex-col gap-1 p-1 text-left hover:bg-moss-wash/50 sm:min-h-28 sm:p-1.5', day === d && 'ring-3 ring-moss ring-inset')}
                    >
                      <span className={cn('inline-flex size-7 items-center justify-center rounded-full text-sm font-semibold', isToday && 'bg-moss text-white')}>
                        {Number(d.slice(8))}
                      </span>
                      {/* A phone's day is too narrow for words: a dot per task (the legend below names the colours); the chosen day lists them below. */}
                      <span className="flex flex-wrap gap-1 sm:hidden" aria-hidden="true">
                        {tasks.slice(0, 6).map((t) => (
                          <span key={t.id} className={cn('size-2.5 rounded-full', dotTone[t.timing] ?? dotTone.upcoming)} />
                        ))}
                        {tasks.length > 6 && <span className="text-[0.65rem] leading-none font-semibold">+{tasks.length - 6}</span>}
                      </span>
                      {tasks.slice(0, 3).map((t) => (
                        <span
                          key={t.id}
                          title={`${t.title}${t.animal?.name ? ` · ${t.animal.name}` : ''}`}
                          className={cn('hidden rounded px-1.5 py-0.5 text-xs leading-tight font-medium break-words sm:line-clamp-2', chipTone[t.timing] ?? chipTone.upcoming)}
                        >
                          {t.animal?.name ? <span className="font-semibold">{t.animal.name}: </span> : null}
                          {t.title}
                        </span>
                      ))}
                      {tasks.length > 3 && <span className="hidden text-xs font-medium text-grey-600 sm:block">+{tasks.length - 3} more</span>}
                    </button>
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-grey-700 sm:hidden" aria-label="What the dots mean">
        {[['overdue', 'late'], ['due_today', 'today'], ['upcoming', 'planned'], ['done', 'done']].map(([timing, word]) => (
          <li key={timing} className="flex items-center gap-1.5">
            <span className={cn('size-2.5 rounded-full', dotTone[timing!])} aria-hidden="true" />
            {word}
          </li>
        ))}
        <li>Tap a day to see its tasks.</li>
      </ul>
      {day && (
        <section aria-labelledby="month-day" className="space-y-2">
          <h2 id="month-day" className="text-lg font-bold">
            {formatLongDay(day)}
          </h2>
          {(byDay.get(day) ?? []).length === 0 ? (
            <p className="text-grey-600">Nothing planned that day.</p>
          ) : (
            <ul className="space-y-2">
              {(byDay.get(day) ?? []).map((t) => (
                <TaskItem key={t.id} task={t} />
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
