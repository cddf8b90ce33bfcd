import { isHeatCaution, type TemperatureReadingDto } from '@burrowline/shared';
import type { TemperatureReading } from './temperature-reading.model';

/** A barn reading in °C, with whether it calls for the heat caution and who took it. */
export function presentReading(r: TemperatureReading, names: Map<string, string>): TemperatureReadingDto {
  const celsius = Number(r.celsius);
  return {
    id: r.id,
    takenAt: r.takenAt.toISOString(),
    celsius,
    place: r.place,
    hot: isHeatCaution(celsius),
    recordedBy: r.recordedBy ? { id: r.recordedBy, name: names.get(r.recordedBy) ?? 'Someone' } : null,
  };
}
