import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { queryClient } from '../../app/query-client';
import { farmsListQueryOptions, useFarms } from '../../features/farms/api/get-farms';
import { TodayCards } from '../../features/almanac/components/today-cards';
import { CommonsHeatCaution } from '../../features/health/components/commons-heat-caution';
import { OverdueLoans } from '../../features/stud-share';
import { MembersDirectory } from '../../features/farms/components/members-directory';
import { NoFarmCard, YourFarmCard } from '../../features/farms/components/your-farm-card';
import { useSession } from '../../lib/session';

export async function loader() {
  await queryClient.ensureQueryData(farmsListQueryOptions());
  return null;
}

export function CommonsPage() {
  const me = useSession();
  const { data: farms } = useFarms();
  const ownFarm = farms.find((farm) => farm.id === me.user.farmId);

  return (
    <div className="space-y-8">
      <PageTitle>Commons</PageTitle>
      <PageHeader title="Commons" lead={`What's going on across ${me.coop.name}.`} />
      <CommonsHeatCaution enabled={Boolean(me.user.farmId)} />
      <OverdueLoans />
      <TodayCards enabled={Boolean(me.user.farmId)} />
      {ownFarm ? <YourFarmCard farm={ownFarm} /> : <NoFarmCard />}
      <MembersDirectory farms={farms} ownFarmId={me.user.farmId} />
    </div>
  );
}
