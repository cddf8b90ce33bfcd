import { ChevronLeft, ChevronRight } from 'lucide-react';
import { useState } from 'react';
import type { StudBlockDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { firstOfMonth, formatLongDay, formatMonth, monthGrid, shiftMonth, weekdayNames } from '../../../lib/days';
import { useAvailability } from '../api/get-buck-cards';
import { blockLabels } from '../stud-share-labels';

const blockTone: Record<StudBlockDto['reason'], string> = {
  loan: 'bg-clay-wash text-clay-deep',
  own_service: 'bg-straw-wash text-bark',
  rest: 'bg-grey-100 text-grey-600',
};

function blockOn(day: string, blocked: StudBlockDto[]): StudBlockDto | undefined {
  return blocked.find((b) => b.startOn <= day && day <= b.endOn);
}

/**
 * The buck's month: the days he is free, and those held by a loan, his own farm's services or his rest
 * between loans (the server merges them per reason). `highlight` marks the dates being asked for.
 */
export function AvailabilityCalendar({ offerId, today, highlight }: { offerId: string; today: string; highlight?: { startOn: string; endOn: string } | null }) {
  const [month, setMonth] = useState(() => firstOfMonth(highlight?.startOn && highlight.startOn > today ? highlight.startOn : today));
  const weeks = monthGrid(month);
  const from = weeks[0]![0]!;
  const to = weeks.at(-1)![6]!;
  const availability = useAvailability(offerId, from, to);
  const blocked = availability.data?.blocked ?? [];
  const freeDays = weeks.flat().filter((d) => d.startsWith(month.slice(0, 7)) && d >= today && !blockOn(d, blocked)).length;

  return (
    <div className="space-y-3" data-testid="availability-calendar">
      <div className="flex items-center justify-between gap-2">
        <Button variant="secondary" onClick={() => setMonth(shiftMonth(month, -1))} aria-label="Previous month" disabled={month <= firstOfMonth(today)}>
          <ChevronLeft className="size-5" aria-hidden="true" />
        </Button>
        <h3 className="text-lg font-bold" aria-live="polite">
          {formatMonth(month)}
        </h3>
        <Button variant="secondary" onClick={() => setMonth(shiftMonth(month, 1))} aria-label="Next month">
          <ChevronRight className="size-5" aria-hidden="true" />
        </Button>
      </div>
      {availability.isPending ? (
        <Spinner label="Reading his calendar…" />
      ) : (
        <table className={cn('w-full table-fixed border-collapse text-center', availability.isFetching && 'opacity-60')}>
          <caption className="sr-only">
            His free days in {formatMonth(month)}: {freeDays} from today on
          </caption>
          <thead>
            <tr>
              {weekdayNames.map((name) => (
                <th key={name} scope="col" className="py-1 text-xs font-semibold text-grey-600 sm:text-sm">
                  {name}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {weeks.map((week) => (
              <tr key={week[0]}>
                {week.map((d) => {
                  const inMonth = d.startsWith(month.slice(0, 7));
                  const block = blockOn(d, blocked);
                  const past = d < today;
                  const asked = highlight && highlight.startOn <= d && d <= highlight.endOn;
                  const status = past ? 'past' : block ? blockLabels[block.reason] : 'free';
                  return (
                    <td key={d} className="p-0.5">
                      <div
                        aria-label={inMonth ? `${formatLongDay(d)}: ${status}${asked ? ', asked for' : ''}` : undefined}
                        aria-hidden={inMonth ? undefined : true}
                        className={cn(
                          'flex h-10 flex-col items-center justify-center rounded-md text-sm sm:h-12',
                          !inMonth && 'invisible',
                          past ? 'text-grey-400' : block ? blockTone[block.reason] : 'bg-moss-wash font-semibold text-moss-deep',
                          asked && 'ring-2 ring-moss ring-offset-1',
                          d === today && 'underline decoration-2 underline-offset-2',
                        )}
                      >
                        {Number(d.slice(8))}
                      </div>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Legend">
        <li className="flex items-center gap-1.5"><span className="inline-block size-3 rounded-sm bg-moss-wash ring-1 ring-moss/40" aria-hidden="true" />Free</li>
        {(Object.keys(blockLabels) as StudBlockDto['reason'][]).map((reason) => (
          <li key={reason} className="flex items-center gap-1.5"><span className={cn('inline-block size-3 rounded-sm ring-1 ring-grey-300', blockTone[reason])} aria-hidden="true" />{blockLabels[reason]}</li>
        ))}
        {highlight && <li className="flex items-center gap-1.5"><span className="inline-block size-3 rounded-sm ring-2 ring-moss" aria-hidden="true" />Your dates</li>}
      </ul>
    </div>
  );
}

