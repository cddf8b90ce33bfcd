import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { meQueryOptions } from '../../features/auth/api/get-me';
import { ApiError } from '../../lib/api-client';
import { buildAbility } from '../../lib/ability';

/** The admin area's loader: only the co-op's admins get past it (the server checks every call again). */
export async function requireCoopAdmin(): Promise<null> {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  const ability = buildAbility(me?.rules ?? []);
  if (!me || !ability.can('manage', subjectOf('Membership', { coopId: me.coop.id }))) {
    throw new ApiError(403, 'forbidden', "The co-op's admin pages are for its admins.");
  }
  return null;
}
