import type { AnimalListQuery, PedigreeCardQuery } from '@burrowline/shared';

/** Every Herd query lives under ['herd'], so one live event (`herd:changed`, `pedigree:changed`) refreshes them all. */
export const herdKeys = {
  all: ['herd'] as const,
  list: (query: AnimalListQuery) => [...herdKeys.all, 'animals', 'list', query] as const,
  detail: (animalId: string) => [...herdKeys.all, 'animals', 'detail', animalId] as const,
  card: (animalId: string) => [...herdKeys.all, 'cards', 'detail', animalId] as const,
  cards: (query: Partial<PedigreeCardQuery>) => [...herdKeys.all, 'cards', 'list', query] as const,
  pedigree: (animalId: string, generations: number) => [...herdKeys.all, 'pedigree', animalId, generations] as const,
  weighIns: (animalId: string) => [...herdKeys.all, 'weigh-ins', animalId] as const,
  trial: (damId: string, sireIds: string[]) => [...herdKeys.all, 'trial', damId, sireIds] as const,
  breeds: () => [...herdKeys.all, 'breeds'] as const,
};
