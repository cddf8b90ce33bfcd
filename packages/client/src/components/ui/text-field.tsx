import type { ComponentProps } from 'react';
import { controlAria, controlClasses, FieldShell, useFieldIds, type FieldProps } from './field';

type TextFieldProps = FieldProps & Omit<ComponentProps<'input'>, 'aria-describedby' | 'aria-invalid'>;

export function TextField({ label, hint, error, id, className, type = 'text', ...inputProps }: TextFieldProps) {
  const ids = useFieldIds(id);
  return (
    <FieldShell label={label} hint={hint} error={error} ids={ids} className={className}>
      <input type={type} className={controlClasses(Boolean(error))} {...controlAria(ids, { hint, error })} {...inputProps} />
    </FieldShell>
  );
}
