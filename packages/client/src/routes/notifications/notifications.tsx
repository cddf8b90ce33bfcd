import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { notificationsQueryOptions, preferencesQueryOptions, useNotificationPreferences } from '../../features/notifications/api/get-notifications';
import { NotificationList } from '../../features/notifications/components/notification-list';
import { PreferencesForm } from '../../features/notifications/components/preferences-form';

export async function loader() {
  await Promise.all([queryClient.ensureQueryData(notificationsQueryOptions(1, 20, false)), queryClient.prefetchQuery(preferencesQueryOptions())]);
  return null;
}

/** /notifications: what the bell holds, and how each kind is e-mailed. */
export function NotificationsPage() {
  const preferences = useNotificationPreferences();
  return (
    <div className="space-y-8">
      <PageTitle>Notifications</PageTitle>
      <PageHeader title="Notifications" lead="Requests, answers and news that concern you or your farm." />
      <NotificationList />
      <Card className="space-y-4">
        <h2 className="text-xl font-bold text-bark">E-mail</h2>
        {preferences.data ? <PreferencesForm current={preferences.data} /> : <Spinner label="Loading preferences" />}
      </Card>
    </div>
  );
}
