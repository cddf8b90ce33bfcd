import type { ComponentProps, ReactNode } from 'react';
import { CircleAlert } from 'lucide-react';
import { useFieldIds } from './field';

type CheckboxFieldProps = Omit<ComponentProps<'input'>, 'type' | 'aria-describedby' | 'aria-invalid'> & {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
};

/** A box to tick with its label beside it; the whole row is the tap target (44 px at least). */
export function CheckboxField({ label, hint, error, id, className, ...inputProps }: CheckboxFieldProps) {
  const ids = useFieldIds(id);
  const describedBy = [hint ? ids.hintId : null, error ? ids.errorId : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={className}>
      <label htmlFor={ids.controlId} className="flex min-h-11 cursor-pointer items-start gap-3 rounded-lg py-2">
        <input
          type="checkbox"
          id={ids.controlId}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className="mt-0.5 size-6 shrink-0 cursor-pointer accent-moss"
          {...inputProps}
        />
        <span className="font-medium">{label}</span>
      </label>
      {hint && (
        <p id={ids.hintId} className="ml-9 text-sm text-grey-600">
          {hint}
        </p>
      )}
      {error && (
        <p id={ids.errorId} className="ml-9 flex items-start gap-1.5 text-sm font-medium text-clay-deep">
          <CircleAlert className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}
