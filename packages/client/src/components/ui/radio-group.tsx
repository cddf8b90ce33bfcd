import { useId, type ComponentProps, type ReactNode } from 'react';
import { CircleAlert } from 'lucide-react';
import { cn } from '../../lib/cn';

export interface RadioOption {
  value: string;
  label: ReactNode;
  hint?: ReactNode;
}

type RadioGroupProps = Omit<ComponentProps<'input'>, 'type' | 'value'> & {
  legend: string;
  options: readonly RadioOption[];
  hint?: ReactNode;
  error?: string;
  /** Side by side for two short answers (yes / no); stacked otherwise. */
  inline?: boolean;
};

/** A fieldset of radio buttons; spread react-hook-form's `register(name)` onto it like an input. */
export function RadioGroup({ legend, options, hint, error, inline = false, className, ...inputProps }: RadioGroupProps) {
  const base = useId();
  const hintId = `${base}-hint`;
  const errorId = `${base}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;
  return (
    <fieldset className={cn('space-y-1.5', className)} aria-describedby={describedBy} aria-invalid={error ? true : undefined}>
      <legend className="font-medium">{legend}</legend>
      {hint && (
        <p id={hintId} className="text-sm text-grey-600">
          {hint}
        </p>
      )}
      <div className={cn('flex gap-x-6 gap-y-1', inline ? 'flex-row flex-wrap' : 'flex-col')}>
        {options.map((option) => {
          const id = `${base}-${option.value}`;
          return (
            <label key={option.value} htmlFor={id} className="flex min-h-11 cursor-pointer items-start gap-3 py-2">
              <input type="radio" id={id} value={option.value} className="mt-0.5 size-6 shrink-0 cursor-pointer accent-moss" {...inputProps} />
              <span>
                <span className="font-medium">{option.label}</span>
                {option.hint && <span className="block text-sm text-grey-600">{option.hint}</span>}
              </span>
            </label>
          );
        })}
      </div>
      {error && (
        <p id={errorId} className="flex items-start gap-1.5 text-sm font-medium text-clay-deep">
          <CircleAlert className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
          <span>{error}</span>
        </p>
      )}
    </fieldset>
  );
}
