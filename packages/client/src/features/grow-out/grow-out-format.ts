import type { Readiness } from '@burrowline/shared';

export const readinessTone: Record<Readiness, 'moss' | 'straw' | 'clay' | 'neutral'> = {
  reached: 'moss', ready: 'moss', likely: 'straw', possible: 'straw', not_ready: 'clay', unknown: 'neutral',
};
