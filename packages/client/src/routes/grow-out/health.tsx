import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { useHealthTreatments, healthTreatmentsQueryOptions } from '../../features/health/api/get-treatments';
import { temperaturesQueryOptions, useTemperatures } from '../../features/health/api/get-temperatures';
import { useWithdrawals, withdrawalsQueryOptions } from '../../features/health/api/get-withdrawals';
import { HeatCautionCard } from '../../features/health/components/heat-caution-card';
import { MedicineCaution } from '../../features/health/components/medicine-caution';
import { TemperatureChart } from '../../features/health/components/temperature-chart';
import { TemperatureForm } from '../../features/health/components/temperature-form';
import { TemperatureList } from '../../features/health/components/temperature-list';
import { TreatmentForm } from '../../features/health/components/treatment-form';
import { TreatmentsList } from '../../features/health/components/treatments-list';
import { WithdrawalsCard } from '../../features/health/components/withdrawals-card';
import { useFarmSubjects } from '../../features/health/hooks/use-farm-subjects';
import { useTemperatureUnit } from '../../features/health/hooks/use-temperature-unit';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';
import { useFarmToday } from '../../features/farms/hooks/use-farm-today';

export async function loader() {
  await Promise.all([
    queryClient.ensureQueryData(withdrawalsQueryOptions()),
    queryClient.ensureQueryData(healthTreatmentsQueryOptions()),
    queryClient.ensureQueryData(temperaturesQueryOptions()),
  ]);
  return null;
}

/** /grow-out/health: what is under withdrawal first, then treatments and the barn's temperature. */
export function HealthPage() {
  const me = useSession();
  const ability = useAbility();
  const farm = { coopId: me.coop.id, farmId: me.user.farmId };
  const canTreat = ability.can('create', subjectOf('Treatment', farm));
  const canLog = ability.can('create', subjectOf('TemperatureReading', farm));
  const unit = useTemperatureUnit();
  const withdrawals = useWithdrawals();
  const treatments = useHealthTreatments();
  const temperatures = useTemperatures();
  const subjects = useFarmSubjects();
  const fallbackToday = useFarmToday();
  const today = withdrawals.data?.today ?? fallbackToday;
  return (
    <div className="space-y-6">
      <PageTitle>Health</PageTitle>
      <PageHeader title="Health" lead="Treatments under a veterinarian and their withdrawal before processing, and the barn's temperature." />
      <MedicineCaution />
      {temperatures.data && <HeatCautionCard heat={temperatures.data.heat} unit={unit} />}
      <WithdrawalsCard withdrawals={withdrawals.data?.withdrawals ?? []} />
      <div className="grid gap-6 lg:grid-cols-2">
        {canTreat && (
          <Card className="space-y-4">
            <h2 className="text-lg font-bold">Record a treatment</h2>
            <TreatmentForm today={today} animals={subjects.animals} groups={subjects.groups} />
          </Card>
        )}
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Barn temperature</h2>
          <p className="text-sm text-grey-600">Rabbits suffer above about 85 °F / 29 °C. A reading at or above that in the last day shows the heat caution on Commons.</p>
          {canLog && <TemperatureForm unit={unit} />}
          {temperatures.data && (
            <>
              <TemperatureChart readings={temperatures.data.readings} unit={unit} />
              <TemperatureList readings={temperatures.data.readings} unit={unit} />
            </>
          )}
        </Card>
      </div>
      <section aria-labelledby="treatments-title" className="space-y-3">
        <h2 id="treatments-title" className="text-lg font-bold">Treatments</h2>
        <TreatmentsList treatments={treatments.data?.treatments ?? []} />
      </section>
    </div>
  );
}
