import type { CapacityPictureDto } from '@burrowline/shared';
import { Snowflake } from 'lucide-react';

/**
 * The day's places at a glance: booked, free and waiting, as three big figures (read at arm's length on the
 * site) over one bar. Places offered to someone from the waiting list are held, so they count as taken.
 * The waiting list hangs past the end of the bar, since it takes no place.
 */
export function CapacityBar({ capacity: c }: { capacity: CapacityPictureDto }) {
  const taken = c.bookedHead + c.offeredHead;
  const whole = Math.max(1, c.capacityHead + c.waitlistedHead);
  const width = (n: number) => `${(Math.max(0, n) / whole) * 100}%`;
  return (
    <section aria-labelledby="capacity-title" className="space-y-3" data-testid="capacity">
      <h2 id="capacity-title" className="sr-only">Places</h2>
      <dl className="grid grid-cols-3 gap-2 text-center">
        <div className="rounded-xl bg-moss-wash px-1 py-2">
          <dt className="text-sm font-medium text-moss-deep">Booked</dt>
          <dd className="text-3xl font-bold text-moss-deep tabular-nums" data-testid="capacity-booked">{c.bookedHead}</dd>
        </div>
        <div className="rounded-xl bg-grey-100 px-1 py-2">
          <dt className="text-sm font-medium text-grey-700">Free</dt>
          <dd className="text-3xl font-bold text-bark tabular-nums" data-testid="capacity-free">{c.freeHead}</dd>
        </div>
        <div className="rounded-xl bg-straw-wash px-1 py-2">
          <dt className="text-sm font-medium text-bark">Waiting</dt>
          <dd className="text-3xl font-bold text-bark tabular-nums" data-testid="capacity-waiting">{c.waitlistedHead}</dd>
        </div>
      </dl>
      <div className="flex h-5 overflow-hidden rounded-full bg-grey-100" aria-hidden="true">
        <div className="h-full bg-moss" style={{ width: width(c.bookedHead) }} />
        <div className="h-full bg-clay" style={{ width: width(c.offeredHead) }} />
        <div className="h-full border-r-2 border-bark bg-grey-200" style={{ width: width(c.capacityHead - taken) }} />
        <div className="h-full bg-[repeating-linear-gradient(135deg,var(--color-straw)_0_6px,var(--color-straw-wash)_6px_12px)]" style={{ width: width(c.waitlistedHead) }} />
      </div>
      <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-grey-700">
        <span>{c.capacityHead} places</span>
        {c.offeredHead > 0 && <span className="font-medium text-clay-deep">{c.offeredHead} held for a confirmation</span>}
        <span className="inline-flex items-center gap-1.5" data-testid="chill-capacity">
          <Snowflake className="size-4" aria-hidden="true" />
          Chill for {c.chillCapacityHead} at once
        </span>
        {c.overChillCapacity && <strong className="text-clay-deep">More booked than the chill holds: chill in rounds</strong>}
      </p>
    </section>
  );
}
