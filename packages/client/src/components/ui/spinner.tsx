import { cn } from '../../lib/cn';

interface SpinnerProps {
  size?: 'sm' | 'lg';
  label?: string;
  /** Inside a button that already says what is happening. */
  decorative?: boolean;
}

export function Spinner({ size = 'lg', label = 'Loading…', decorative = false }: SpinnerProps) {
  const svg = (
    <svg
      className={cn('animate-spin', size === 'sm' ? 'size-4' : 'size-8')}
      viewBox="0 0 24 24"
      fill="none"
      aria-hidden="true"
    >
      <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
  if (decorative) return svg;
  return (
    <span role="status" className="inline-flex items-center gap-3 text-moss">
      {svg}
      <span className="sr-only">{label}</span>
    </span>
  );
}

export function PageSpinner() {
  return (
    <div className="flex min-h-[50dvh] items-center justify-center">
      <Spinner />
    </div>
  );
}
