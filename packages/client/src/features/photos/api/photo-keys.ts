import { farmKeys } from '../../farms';
import { herdKeys } from '../../herd';

/** An animal's photos live under the Herd's keys (a `herd:changed` refreshes them); a farm's under the farm's. */
export const photoKeys = {
  animal: (animalId: string) => [...herdKeys.all, 'photos', animalId] as const,
  farm: (farmId: string) => [...farmKeys.detail(farmId), 'photo'] as const,
};
