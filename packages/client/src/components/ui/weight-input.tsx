import type { WeightUnit } from '@burrowline/shared';
import { TextField } from './text-field';

/**
 * A weight typed in the farm's units: pounds and ounces, or kilograms and grams. The first field carries
 * the label given (e.g. "Total weight (lb)"), the second its smaller unit.
 */
export function WeightInput({ label, unit, major, minor, onMajor, onMinor, error, hint }: {
  label: string; unit: WeightUnit; major: string; minor: string; onMajor: (v: string) => void; onMinor: (v: string) => void; error?: string; hint?: string;
}) {
  const big = unit === 'lb_oz' ? 'lb' : 'kg';
  const small = unit === 'lb_oz' ? 'oz' : 'g';
  return (
    <fieldset className="grid grid-cols-2 gap-2">
      <legend className="sr-only">{label}</legend>
      <TextField label={`${label} (${big})`} inputMode="decimal" value={major} onChange={(e) => onMajor(e.target.value)} error={error} />
      <TextField label={`${label} (${small})`} inputMode="decimal" value={minor} onChange={(e) => onMinor(e.target.value)} />
      {hint && <p className="col-span-2 text-sm text-grey-600">{hint}</p>}
    </fieldset>
  );
}

