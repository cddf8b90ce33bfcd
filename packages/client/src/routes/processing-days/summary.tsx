import { ArrowLeft, FileText } from 'lucide-react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { buttonClasses } from '../../components/ui/button-styles';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { daySheetUrl, summaryQueryOptions, useDaySummary } from '../../features/processing-days/api/get-processing-days';
import { DaySummary } from '../../features/processing-days/components/day-summary';
import { formatLongDay } from '../../lib/days';
import { idFrom, useIdParam } from '../almanac/id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(summaryQueryOptions(idFrom(params, 'dayId')));
  return null;
}

/** /processing-days/:dayId/summary — what the day produced, per farm and per breed or cross, and how the costs were shared. */
export function DaySummaryPage() {
  const dayId = useIdParam('dayId');
  const { data } = useDaySummary(dayId);
  if (!data) return null;
  return (
    <div className="space-y-6">
      <PageTitle>{`Processing day summary ${data.date}`}</PageTitle>
      <TextLink to={`/processing-days/${dayId}`}><ArrowLeft className="mr-1 size-4" aria-hidden="true" />The day</TextLink>
      <PageHeader
        title="Day summary"
        lead={formatLongDay(data.date)}
        actions={<a className={buttonClasses('secondary')} href={daySheetUrl(dayId)} download><FileText className="size-5" aria-hidden="true" />Day sheet (PDF)</a>}
      />
      <DaySummary summary={data} />
    </div>
  );
}
