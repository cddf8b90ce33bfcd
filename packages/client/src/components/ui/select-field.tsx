import type { ComponentProps } from 'react';
import { ChevronDown } from 'lucide-react';
import { controlAria, controlClasses, FieldShell, useFieldIds, type FieldProps } from './field';

export interface SelectOption {
  value: string;
  label: string;
}

type SelectFieldProps = FieldProps &
  Omit<ComponentProps<'select'>, 'aria-describedby' | 'aria-invalid' | 'children'> & {
    options: readonly SelectOption[];
  };

export function SelectField({ label, hint, error, id, className, options, ...selectProps }: SelectFieldProps) {
  const ids = useFieldIds(id);
  return (
    <FieldShell label={label} hint={hint} error={error} ids={ids} className={className}>
      <div className="relative">
        <select className={controlClasses(Boolean(error), 'appearance-none pr-10')} {...controlAria(ids, { hint, error })} {...selectProps}>
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </select>
        <ChevronDown className="pointer-events-none absolute top-1/2 right-3 size-5 -translate-y-1/2 text-grey-600" aria-hidden="true" />
      </div>
    </FieldShell>
  );
}
