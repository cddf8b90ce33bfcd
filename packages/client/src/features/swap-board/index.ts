/** What this feature offers other features; everything else in the folder is private to it. */
export { swapBoardKeys } from './api/swap-board-keys';
export { SwapBoardSummary } from './components/swap-board-summary';
