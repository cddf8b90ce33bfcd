/** What this feature offers other features; everything else in the folder is private to it. */
export { studShareKeys } from './api/stud-share-keys';
export { StudShareSummary } from './components/stud-share-summary';
export { OverdueLoans } from './components/overdue-loans';
