import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export type BadgeTone = 'neutral' | 'moss' | 'straw' | 'clay';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-grey-100 text-grey-700',
  moss: 'bg-moss-wash text-moss-deep',
  straw: 'bg-straw-wash text-bark',
  clay: 'bg-clay-wash text-clay-deep',
};

/** A short status word on a tinted ground; the word carries the meaning, the colour only helps. */
export function Badge({ tone = 'neutral', children, className, wrap = false }: { tone?: BadgeTone; children: ReactNode; className?: string; wrap?: boolean }) {
  return (
    <span className={cn('inline-flex items-center rounded-md px-2 py-0.5 text-sm font-semibold', wrap ? 'whitespace-normal' : 'whitespace-nowrap', tones[tone], className)}>
      {children}
    </span>
  );
}

/** A count for the navigation (e.g. new applications); hidden when zero, always named for screen readers. */
export function CountBadge({ count, label }: { count: number; label: string }) {
  if (count <= 0) return null;
  return (
    <span className="ml-0.5 inline-flex min-w-6 items-center justify-center rounded-full bg-clay px-1.5 text-sm leading-6 font-bold text-white">
      <span aria-hidden="true">{count > 99 ? '99+' : count}</span>
      <span className="sr-only">{`, ${count} ${label}`}</span>
    </span>
  );
}
