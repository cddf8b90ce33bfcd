import type { DoeBoardQuery } from '@burrowline/shared';

/** Under ['almanac'], so a service, palpation, kindling or litter change (which refreshes the Almanac) refreshes these too. */
export const doeBoardKeys = {
  board: (query: DoeBoardQuery) => ['almanac', 'doe-board', query] as const,
  record: (doeId: string) => ['almanac', 'breeding-record', doeId] as const,
};
