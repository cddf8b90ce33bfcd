import { cn } from '../../lib/cn';

interface ProgressBarProps {
  label: string;
  /** 0–1; null while the total is not known yet. */
  value: number | null;
  /** What the bar says in words, e.g. "3,000 of 10,000 rows". */
  detail?: string;
  tone?: 'moss' | 'straw';
}

/** A labelled progress bar (announced to screen readers through the native progress element). */
export function ProgressBar({ label, value, detail, tone = 'moss' }: ProgressBarProps) {
  const percent = value === null ? null : Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div className="space-y-1.5">
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span className="font-semibold text-bark">{label}</span>
        <span className="text-grey-600 tabular-nums">{detail ?? (percent === null ? '' : `${percent}%`)}</span>
      </div>
      <progress className="sr-only" aria-label={label} value={percent ?? undefined} max={100} />
      <div className="h-3 overflow-hidden rounded-full bg-grey-100" aria-hidden="true">
        <div
          className={cn('h-full rounded-full transition-[width] duration-200', tone === 'moss' ? 'bg-moss' : 'bg-straw', percent === null && 'w-1/3 animate-pulse')}
          style={percent === null ? undefined : { width: `${percent}%` }}
        />
      </div>
    </div>
  );
}
