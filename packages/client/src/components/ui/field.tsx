import { useId, type ReactNode } from 'react';
import { CircleAlert } from 'lucide-react';
import { cn } from '../../lib/cn';

export interface FieldProps {
  label: string;
  /** Guidance shown under the label, always read out with the control. */
  hint?: ReactNode;
  error?: string;
}

export interface FieldIds {
  controlId: string;
  hintId: string;
  errorId: string;
}

export function useFieldIds(id?: string): FieldIds {
  const generated = useId();
  const controlId = id ?? generated;
  return { controlId, hintId: `${controlId}-hint`, errorId: `${controlId}-error` };
}

/** The ARIA wiring every control needs so its hint and error are announced with it. */
export function controlAria(ids: FieldIds, { hint, error }: Pick<FieldProps, 'hint' | 'error'>) {
  const describedBy = [hint ? ids.hintId : null, error ? ids.errorId : null].filter(Boolean).join(' ');
  return {
    id: ids.controlId,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': describedBy || undefined,
  } as const;
}

export function controlClasses(hasError: boolean, extra?: string): string {
  return cn(
    'block w-full rounded-lg border-2 bg-white px-3 py-2.5 text-base text-bark placeholder:text-grey-500',
    'min-h-12 focus-visible:border-moss',
    hasError ? 'border-clay' : 'border-grey-500',
    extra,
  );
}

interface FieldShellProps extends FieldProps {
  ids: FieldIds;
  children: ReactNode;
  className?: string;
}

export function FieldShell({ label, hint, error, ids, children, className }: FieldShellProps) {
  return (
    <div className={cn('space-y-1.5', className)}>
      <label htmlFor={ids.controlId} className="block font-medium">
        {label}
      </label>
      {hint && (
        <p id={ids.hintId} className="text-sm text-grey-600">
          {hint}
        </p>
      )}
      {children}
      {error && (
        <p id={ids.errorId} className="flex items-start gap-1.5 text-sm font-medium text-clay-deep">
          <CircleAlert className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}
