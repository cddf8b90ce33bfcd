import type { FarmDto } from '@burrowline/shared';
import type { Farm } from './farm.model';

export function presentFarm(farm: Farm): FarmDto {
  return {
    id: farm.id,
    name: farm.name,
    location: farm.location,
    timeZone: farm.timeZone,
    weightUnit: farm.weightUnit,
    temperatureUnit: farm.temperatureUnit,
    breedsKept: farm.breedsKept,
    description: farm.description,
    latitude: farm.latitude ?? null,
    longitude: farm.longitude ?? null,
    sharesGetRecords: farm.sharesGetRecords ?? true,
    version: farm.version,
    members: (farm.members ?? [])
      .filter((m) => !m.disabledAt)
      .map((m) => ({ id: m.id, name: m.name, role: m.role }))
      .sort((a, b) => a.name.localeCompare(b.name)),
    updatedAt: farm.updatedAt.toISOString(),
  };
}
