/** What this feature offers other features; everything else in the folder is private to it. */
export { farmKeys } from './api/farm-keys';
export { farmDetailQueryOptions } from './api/get-farm';
export { useFarmToday } from './hooks/use-farm-today';
export { timeZoneOptions } from './time-zone-options';
export { parseBreeds } from './components/breeds-field';
export { BreedTags } from './components/breed-tags';
