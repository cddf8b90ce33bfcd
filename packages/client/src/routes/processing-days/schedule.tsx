import { ArrowLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { useFarmToday } from '../../features/farms';
import { sitesQueryOptions, useSites } from '../../features/processing-days/api/get-processing-days';
import { ScheduleDayForm } from '../../features/processing-days/components/schedule-day-form';
import { subjectOf } from '@burrowline/shared';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';

export async function loader() {
  await queryClient.ensureQueryData(sitesQueryOptions());
  return null;
}

/** /processing-days/new — the admin, or a host the admin allows, schedules a day at one of the co-op's sites. */
export function ScheduleDayPage() {
  const me = useSession();
  const ability = useAbility();
  const today = useFarmToday();
  const { data: sites = [] } = useSites();
  const isAdmin = ability.can('manage', subjectOf('ProcessingDay', { coopId: me.coop.id }));
  const usable = isAdmin ? sites : sites.filter((s) => s.hostMaySchedule && s.hostFarmId === me.user.farmId);
  return (
    <div className="space-y-6">
      <PageTitle>Schedule a processing day</PageTitle>
      <TextLink to="/processing-days"><ArrowLeft className="mr-1 size-4" aria-hidden="true" />All processing days</TextLink>
      <PageHeader title="Schedule a day" lead="Places, deadline, fee, costs, stations and equipment. Members are told when it is scheduled." />
      <Card>
        {usable.length === 0 ? (
          <p className="text-grey-700">{isAdmin ? <>Add a site first, in <TextLink to="/processing-days/sites">Sites</TextLink>.</> : 'No site lets your farm schedule days.'}</p>
        ) : (
          <ScheduleDayForm sites={usable} today={today} />
        )}
      </Card>
    </div>
  );
}
