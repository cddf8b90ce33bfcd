import { formatTemperature, type TemperatureReadingDto, type TemperatureUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { formatInstant } from '../health-format';

/** The latest readings, newest first. */
export function TemperatureList({ readings, unit }: { readings: TemperatureReadingDto[]; unit: TemperatureUnit }) {
  if (readings.length === 0) return <p className="text-grey-600">No readings in the last 30 days.</p>;
  return (
    <ul aria-label="Recent readings" className="divide-y divide-grey-200">
      {readings.slice(0, 8).map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
          <span>
            <strong>{formatTemperature(r.celsius, unit)}</strong> {r.place && <span className="text-grey-600">· {r.place}</span>}
            {r.hot && <Badge tone="clay" className="ml-2">Hot</Badge>}
          </span>
          <span className="text-sm text-grey-600">
            {formatInstant(r.takenAt)}
            {r.recordedBy ? ` · ${r.recordedBy.name}` : ''}
          </span>
        </li>
      ))}
    </ul>
  );
}
