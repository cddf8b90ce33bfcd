import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { settingsQueryOptions, useMentorshipSettings } from '../../features/mentorship/api/mentorship-queries';
import { MentorshipSettingsForm } from '../../features/mentorship/components/settings-form';

export async function loader() {
  await queryClient.ensureQueryData(settingsQueryOptions());
  return null;
}

/** /mentorship/settings: the admin's chore kinds, skills checklist and roster rule. */
export function MentorshipSettingsPage() {
  const settings = useMentorshipSettings();
  return (
    <div className="space-y-6">
      <PageTitle>Mentorship settings</PageTitle>
      <PageHeader title="Mentorship settings" lead="The co-op's chores, its skills checklist and what each sign-off means." />
      <Card>{settings.data ? <MentorshipSettingsForm current={settings.data} /> : <Spinner label="Loading settings" />}</Card>
    </div>
  );
}
