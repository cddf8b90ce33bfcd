import { BookOpen } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { coopSettingsQueryOptions, useCoopSettings } from '../../features/members/api/get-coop-settings';
import { ChatSummary } from '../../features/chat';
import { MentorshipSummary } from '../../features/mentorship';
import { ProcessingDaysSummary } from '../../features/processing-days';
import { StudShareSummary } from '../../features/stud-share';
import { SwapBoardSummary } from '../../features/swap-board';
import { formatInstantDate } from '../../lib/dates';
import { useSession } from '../../lib/session';

export async function loader() {
  await queryClient.ensureQueryData(coopSettingsQueryOptions());
  return null;
}

/** /co-op: what the farms do together, each part with its next thing to do, and the rules every member agreed to. */
export function CoopPage() {
  const me = useSession();
  const { data: coop } = useCoopSettings();
  return (
    <div className="space-y-8">
      <PageTitle>Co-op</PageTitle>
      <PageHeader title="Co-op" lead={`What the farms of ${me.coop.name} do together.`} />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-2 [&>*]:min-w-0">
        <ProcessingDaysSummary />
        <StudShareSummary />
        <SwapBoardSummary />
        <ChatSummary />
        <MentorshipSummary />
      </div>
      <Card className="space-y-3" aria-labelledby="coop-rules">
        <h2 id="coop-rules" className="flex items-center gap-2 text-xl font-bold">
          <BookOpen className="size-5 text-moss" aria-hidden="true" />
          The co-op's rules
        </h2>
        {coop.rulesText ? (
          <>
            <div className="max-w-prose whitespace-pre-line text-bark">{coop.rulesText}</div>
            <p className="text-sm text-grey-600">Last changed {formatInstantDate(coop.updatedAt)}.</p>
          </>
        ) : (
          <p className="text-grey-600">The co-op has not written its rules down yet.</p>
        )}
      </Card>
    </div>
  );
}
