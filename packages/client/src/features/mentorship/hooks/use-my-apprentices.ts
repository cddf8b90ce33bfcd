import { useQuery } from '@tanstack/react-query';
import { useSession } from '../../../lib/session';
import { homeQueryOptions } from '../api/mentorship-queries';

/**
 * The signed-in member's own apprentices: only her mentor accepts or returns an apprentice's entry (another
 * member of the farm and the admin are refused), so only she is shown the buttons.
 */
export function useMyApprentices(): { includes: (userId: string | null | undefined) => boolean; any: boolean } {
  const { user } = useSession();
  const home = useQuery({ ...homeQueryOptions(), enabled: user.role !== 'apprentice' });
  const mine = new Set((home.data?.apprentices ?? []).filter((a) => a.mentor?.id === user.id).map((a) => a.id));
  return { includes: (userId) => Boolean(userId && mine.has(userId)), any: mine.size > 0 };
}
