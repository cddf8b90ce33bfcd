import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { coopSettingsQueryOptions, useCoopSettings } from '../../features/members/api/get-coop-settings';
import { RulesEditor } from '../../features/members/components/rules-editor';

export async function loader() {
  await queryClient.ensureQueryData(coopSettingsQueryOptions());
  return null;
}

export function RulesPage() {
  const { data: settings } = useCoopSettings();
  return (
    <div className="space-y-6">
      <PageTitle>Co-op rules</PageTitle>
      <PageHeader
        title="Co-op rules"
        lead={
          <>
            Shown on{' '}
            <a href={`/apply/${settings.slug}`} className="font-medium whitespace-nowrap text-moss-deep underline underline-offset-4">
              the application form
            </a>
            ; every applicant agrees to them.
          </>
        }
      />
      <Card>
        <RulesEditor settings={settings} />
      </Card>
    </div>
  );
}
