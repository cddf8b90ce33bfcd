import type { ComponentProps } from 'react';
import type { WeightUnit } from '@burrowline/shared';
import { TextField } from './text-field';

type BoxProps = Omit<ComponentProps<'input'>, 'aria-describedby' | 'aria-invalid'>;

/**
 * A weight typed in the farm's units: pounds and ounces, or kilograms and grams. The first field carries
 * the label given (e.g. "Total weight (lb)"), the second its smaller unit. Each box takes its input
 * props (a form's `register(...)`); the form turns the two into grams.
 */
export function WeightInput({ label, unit, error, hint, majorProps, minorProps }: {
  label: string; unit: WeightUnit; error?: string; hint?: string; majorProps: BoxProps; minorProps: BoxProps;
}) {
  const big = unit === 'lb_oz' ? 'lb' : 'kg';
  const small = unit === 'lb_oz' ? 'oz' : 'g';
  return (
    <fieldset className="grid grid-cols-2 gap-2">
      <legend className="sr-only">{label}</legend>
      <TextField label={`${label} (${big})`} inputMode="decimal" error={error} {...majorProps} />
      <TextField label={`${label} (${small})`} inputMode="decimal" {...minorProps} />
      {hint && <p className="col-span-2 text-sm text-grey-600">{hint}</p>}
    </fieldset>
  );
}
