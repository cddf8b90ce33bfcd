import { useMemo } from 'react';
import { subjectOf } from '@burrowline/shared';
import { Outlet, useLoaderData } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { NavigationProgress } from '../../components/layout/navigation-progress';
import { TopBar } from '../../components/layout/top-bar';
import type { requireMe } from '../../app/route-guards';
import { useUnreadApplications } from '../../features/applications/api/get-unread-applications';
import { useMe } from '../../features/auth/api/get-me';
import { useSignOut } from '../../features/auth/api/sign-out';
import { NotificationToast, useUnreadNotifications } from '../../features/notifications';
import { useRealtimeSync } from '../../features/realtime/hooks/use-realtime-sync';
import { AbilityContext, buildAbility } from '../../lib/ability';
import { roleLabels } from '../../lib/role-labels';
import { SessionContext } from '../../lib/session';

export function SignedInLayout() {
  const loadedMe = useLoaderData<typeof requireMe>();
  // While signing out the cache already says null; keep rendering the last known person until we leave.
  const me = useMe().data ?? loadedMe;
  const ability = useMemo(() => buildAbility(me.rules), [me.rules]);
  const signOut = useSignOut();
  const isAdmin = ability.can('manage', subjectOf('Application', { coopId: me.coop.id }));
  // Apprentices never see money: no Ledger in their menu.
  const seesMoney = Boolean(me.user.farmId) && ability.can('read', subjectOf('Money', { coopId: me.coop.id, farmId: me.user.farmId }));
  const unread = useUnreadApplications(isAdmin);
  const unreadNotifications = useUnreadNotifications();
  useRealtimeSync();

  return (
    <SessionContext value={me}>
      <AbilityContext value={ability}>
        <NavigationProgress />
        <TopBar
          coopName={me.coop.name}
          personName={me.user.name}
          roleLabel={roleLabels[me.user.role]}
          farmId={me.user.farmId}
          onSignOut={() => signOut.mutate()}
          isSigningOut={signOut.isPending}
          admin={isAdmin ? { unreadApplications: unread.data ?? 0 } : undefined}
          ledger={seesMoney}
          unreadNotifications={unreadNotifications.data?.unread ?? 0}
        />
        <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-4 pt-6 pb-24 focus:outline-none sm:pt-8 lg:pb-8">
          {signOut.isError && (
            <Alert tone="error" title="Not signed out" className="mb-6">
              {signOut.error.message}
            </Alert>
          )}
          <Outlet />
        </main>
        <NotificationToast />
      </AbilityContext>
    </SessionContext>
  );
}
