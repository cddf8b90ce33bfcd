/** What this feature offers other features; everything else in the folder is private to it. */
export { processingDayKeys } from './api/keys';
export { ProcessingDaysSummary } from './components/processing-days-summary';
