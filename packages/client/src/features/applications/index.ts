/** What this feature offers other features; everything else in the folder is private to it. */
export { applicationKeys } from './api/application-keys';
