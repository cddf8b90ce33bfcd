/** What this feature offers other features; everything else in the folder is private to it. */
export { litterKeys } from './api/litter-keys';
export { housingUnitsQueryOptions, useHousingUnits } from './api/housing';
export { useDamKindlingDays } from './api/get-dam-kindling-days';
