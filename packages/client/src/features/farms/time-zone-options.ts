import type { SelectOption } from '../../components/ui/select-field';
import { timeZoneLabel } from './farm-labels';

let zones: string[] | null = null;

function allTimeZones(): string[] {
  zones ??= typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : ['UTC'];
  return zones;
}

/** Every IANA zone the browser knows, plus the farm's current one even if this browser lacks it. */
export function timeZoneOptions(current: string): SelectOption[] {
  const names = new Set(allTimeZones());
  if (current) names.add(current);
  return [...names].sort().map((zone) => ({ value: zone, label: timeZoneLabel(zone) }));
}
