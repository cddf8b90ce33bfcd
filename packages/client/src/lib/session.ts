import { createContext, use } from 'react';
import type { MeDto } from '@burrowline/shared';

/** The signed-in person and co-op; provided by the signed-in layout, so screens below it never see null. */
export const SessionContext = createContext<MeDto | null>(null);

export function useSession(): MeDto {
  const me = use(SessionContext);
  if (!me) throw new Error('useSession is only available inside the signed-in layout');
  return me;
}
