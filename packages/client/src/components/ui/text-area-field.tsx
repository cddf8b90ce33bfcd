import type { ComponentProps } from 'react';
import { controlAria, controlClasses, FieldShell, useFieldIds, type FieldProps } from './field';

type TextAreaFieldProps = FieldProps & Omit<ComponentProps<'textarea'>, 'aria-describedby' | 'aria-invalid'>;

export function TextAreaField({ label, hint, error, id, className, rows = 5, ...textareaProps }: TextAreaFieldProps) {
  const ids = useFieldIds(id);
  return (
    <FieldShell label={label} hint={hint} error={error} ids={ids} className={className}>
      <textarea rows={rows} className={controlClasses(Boolean(error), 'resize-y')} {...controlAria(ids, { hint, error })} {...textareaProps} />
    </FieldShell>
  );
}
