/** What this feature offers other features; everything else in the folder is private to it. */
export { almanacKeys } from './api/almanac-keys';
export { breedingStockQueryOptions } from './api/get-breeding-stock';
