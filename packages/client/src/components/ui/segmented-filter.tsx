import { cn } from '../../lib/cn';

export interface SegmentOption<V extends string> {
  value: V;
  label: string;
  count?: number;
}

interface SegmentedFilterProps<V extends string> {
  label: string;
  options: readonly SegmentOption<V>[];
  value: V;
  onChange: (value: V) => void;
}

/** A row of toggle buttons for one filter (e.g. an application's status); wraps on a phone. */
export function SegmentedFilter<V extends string>({ label, options, value, onChange }: SegmentedFilterProps<V>) {
  return (
    <div role="group" aria-label={label} className="flex flex-wrap gap-2">
      {options.map((option) => {
        const active = option.value === value;
        return (
          <button
            key={option.value}
            type="button"
            aria-pressed={active}
            onClick={() => onChange(option.value)}
            className={cn(
              'inline-flex min-h-11 items-center gap-1.5 rounded-lg border-2 px-3 font-semibold transition-colors',
              active ? 'border-moss bg-moss text-white' : 'border-grey-300 bg-white text-bark hover:border-moss',
            )}
          >
            {option.label}
            {option.count !== undefined && (
              <span className={cn('rounded-full px-1.5 text-sm', active ? 'bg-white/20' : 'bg-grey-100')}>{option.count}</span>
            )}
          </button>
        );
      })}
    </div>
  );
}
