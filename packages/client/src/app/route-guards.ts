import { redirect } from 'react-router-dom';
import type { MeDto } from '@burrowline/shared';
import { meQueryOptions } from '../features/auth/api/get-me';
import { farmDetailQueryOptions } from '../features/farms/api/get-farm';
import { queryClient } from './query-client';

/** Only our own paths; never `//elsewhere` or an absolute URL handed in by a crafted link. */
export function safeNextPath(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  return next;
}

/** Loader for the signed-in area: the person, or off to sign-in with a way back. */
export async function requireMe({ request }: { request: Request }): Promise<MeDto> {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me) {
    // The farm's units and time zone, known before any form takes its defaults from them; a failure here
    // leaves the pages to load the farm themselves.
    if (me.user.farmId) await queryClient.ensureQueryData(farmDetailQueryOptions(me.user.farmId)).catch(() => null);
    return me;
  }
  const url = new URL(request.url);
  const back = `${url.pathname}${url.search}`;
  throw redirect(back === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(back)}`);
}

/** Loader for the sign-in screens: someone already signed in goes straight in. */
export async function redirectIfSignedIn({ request }: { request: Request }): Promise<null> {
  // If the API cannot be reached, still show the form: its own submit reports the problem.
  const me = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
  if (me) throw redirect(safeNextPath(new URL(request.url).searchParams.get('next')));
  return null;
}
