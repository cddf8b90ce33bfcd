/** What this feature offers other features; everything else in the folder is private to it. */
export { herdKeys } from './api/herd-keys';
export { herdQueryOptions } from './api/get-herd';
export { useTrialMatings } from './api/run-trial-matings';
export { coiLevel, formatCoi } from './herd-labels';
