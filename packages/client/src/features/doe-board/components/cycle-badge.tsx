import type { DoeCycleState, DoeNextAction } from '@burrowline/shared';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { cn } from '../../../lib/cn';
import { relativeDay } from '../../../lib/days';

const tones: Record<DoeCycleState['state'], BadgeTone> = {
  growing: 'neutral',
  open: 'straw',
  serviced: 'moss',
  palpated_positive: 'moss',
  due: 'straw',
  overdue: 'clay',
  nursing: 'moss',
  resting: 'neutral',
};

/** Where a doe stands, in words ("Serviced, day 9"); the tint only helps. */
export function CycleBadge({ cycle, className, wrap = false }: { cycle: DoeCycleState; className?: string; wrap?: boolean }) {
  return (
    <Badge tone={tones[cycle.state]} className={className} wrap={wrap}>
      {cycle.label}
    </Badge>
  );
}

/** Past about two months a count of days says less than when: "waiting since Oct 2023". */
const LONG_WAIT_DAYS = 60;

function lateness(next: DoeNextAction, today: string): string {
  if (next.daysLate > LONG_WAIT_DAYS) {
    return `waiting since ${new Date(`${next.on}T00:00:00Z`).toLocaleDateString('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' })}`;
  }
  return `${next.daysLate} ${next.daysLate === 1 ? 'day' : 'days'} late (${relativeDay(next.on, today)})`;
}

/** The next job and its day: "Palpate · Thursday 18 Jun", or how late it is. */
export function NextAction({ next, today, className }: { next: DoeNextAction | null; today: string; className?: string }) {
  if (!next) return <span className="text-grey-500">—</span>;
  return (
    <span className={cn('inline-flex flex-wrap items-baseline gap-x-1.5', className)}>
      <span className="font-semibold">{next.label}</span>
      <span className={next.daysLate > 0 ? 'font-semibold text-clay-deep' : 'text-grey-700'}>
        {next.daysLate > 0 ? lateness(next, today) : relativeDay(next.on, today)}
      </span>
    </span>
  );
}
