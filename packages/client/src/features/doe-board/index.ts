/** What the doe board offers other features: a doe's place in her cycle, in words (the herd list's column). */
export { CycleBadge, NextAction } from './components/cycle-badge';
