/** What this feature offers other features; everything else in the folder is private to it. */
export { growOutKeys } from './api/grow-out-keys';
export { groupsQueryOptions } from './api/get-groups';
