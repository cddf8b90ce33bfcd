/** What this feature offers other features; everything else in the folder is private to it. */
export { leaveSignedInArea } from './leave-signed-in-area';
