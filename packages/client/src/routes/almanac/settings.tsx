import { ArrowLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { cycleSettingsQueryOptions, useCycleSettings } from '../../features/almanac/api/get-cycle-settings';
import { CalendarFeedPanel } from '../../features/almanac/components/calendar-feed-panel';
import { CycleSettingsForm } from '../../features/almanac/components/cycle-settings-form';
import { MorningEmailPanel } from '../../features/almanac/components/morning-email-panel';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';

export async function loader() {
  await queryClient.ensureQueryData(cycleSettingsQueryOptions());
  return null;
}

export function AlmanacSettingsPage() {
  const { data: settings } = useCycleSettings();
  const rights = useAlmanacRights();
  const unit = useWeightUnit();
  return (
    <div className="space-y-6">
      <PageTitle>Almanac settings</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader title="Almanac settings" lead="Your farm's own cycle. Changing a day re-plans open tasks; done ones stay as they were." />
      <div className="grid gap-6 lg:grid-cols-3">
        <Card className="space-y-4 lg:col-span-2">
          <h2 className="text-lg font-bold">Cycle</h2>
          <CycleSettingsForm current={settings} canEdit={rights.canPlan} unit={unit} />
        </Card>
        <div className="space-y-6">
          <CalendarFeedPanel canManage={rights.canManageFeed} />
          <MorningEmailPanel />
        </div>
      </div>
    </div>
  );
}
