import { subjectOf } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { useFarmSubjects } from '../../features/health/hooks/use-farm-subjects';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { processingQueryOptions, useProcessing } from '../../features/processing/api/get-processing';
import { MarksCard } from '../../features/processing/components/marks-card';
import { ProcessingCautions } from '../../features/processing/components/processing-cautions';
import { ProcessingForm } from '../../features/processing/components/processing-form';
import { ProcessingTable } from '../../features/processing/components/processing-table';
import { useAbility } from '../../lib/ability';
import { useSession } from '../../lib/session';
import { useFarmToday } from '../../features/farms/hooks/use-farm-today';

export async function loader() {
  await queryClient.ensureQueryData(processingQueryOptions());
  return null;
}

/** /grow-out/processing: the yields of what was processed (dress-out, USDA class, flags), and what is marked for processing. */
export function ProcessingPage() {
  const me = useSession();
  const ability = useAbility();
  const canEdit = ability.can('create', subjectOf('ProcessingRecord', { coopId: me.coop.id, farmId: me.user.farmId }));
  const unit = useWeightUnit();
  const { data } = useProcessing();
  const subjects = useFarmSubjects();
  const fallbackToday = useFarmToday();
  const today = data?.today ?? fallbackToday;
  return (
    <div className="space-y-6">
      <PageTitle>Processing</PageTitle>
      <PageHeader title="Processing" lead="Live and carcass weights, dress-out and USDA class of each animal or batch processed, and what is marked for the next processing day." />
      <ProcessingCautions />
      <MarksCard marks={data?.marks ?? []} today={today} canEdit={canEdit} animals={subjects.animals} groups={subjects.groups} />
      {canEdit && (
        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Record processing</h2>
          <ProcessingForm today={today} unit={unit} animals={subjects.animals} groups={subjects.groups} birthDates={subjects.birthDates} />
        </Card>
      )}
      <section aria-labelledby="records-title" className="space-y-3">
        <h2 id="records-title" className="text-lg font-bold">Processing records</h2>
        <ProcessingTable records={data?.records ?? []} unit={unit} />
      </section>
    </div>
  );
}
