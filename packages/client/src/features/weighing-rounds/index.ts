/** What this feature offers other features; everything else in the folder is private to it. */
export { weighingRoundLink } from './weighing-round-link';
