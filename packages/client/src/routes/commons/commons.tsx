import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { queryClient } from '../../app/query-client';
import { farmsListQueryOptions, useFarms } from '../../features/farms/api/get-farms';
import { TodayCards } from '../../features/almanac/components/today-cards';
import { CommonsHeatCaution } from '../../features/health/components/commons-heat-caution';
import { FirstSteps } from '../../features/farms/components/first-steps';
import { OverdueLoans } from '../../features/stud-share';
import { MembersDirectory } from '../../features/farms/components/members-directory';
import { herdQueryOptions } from '../../features/herd/api/get-herd';
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
  // A member's farm with no animal yet gets its first steps (an apprentice's is the mentor's herd).
  const startsOut = me.user.role !== 'apprentice' && Boolean(me.user.farmId);
  const herd = useQuery({ ...herdQueryOptions({ status: 'all', sort: 'tattoo', dir: 'asc', page: 1, pageSize: 1 }), enabled: startsOut });
  const emptyHerd = startsOut && herd.data?.total === 0;

  return (
    <div className="space-y-8">
      <PageTitle>Commons</PageTitle>
      <PageHeader title="Commons" lead={`What's going on across ${me.coop.name}.`} />
      {emptyHerd && <FirstSteps />}
      <OverdueLoans />
      <TodayCards enabled={Boolean(me.user.farmId)} />
      <CommonsHeatCaution enabled={Boolean(me.user.farmId)} />
      {ownFarm ? <YourFarmCard farm={ownFarm} /> : <NoFarmCard />}
      <MembersDirectory farms={farms} ownFarmId={me.user.farmId} />
    </div>
  );
}
