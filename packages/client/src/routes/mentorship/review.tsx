import { reviewQueueQuerySchema } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { queueQueryOptions } from '../../features/mentorship/api/mentorship-queries';
import { ReviewQueue } from '../../features/mentorship/components/review-queue';
import { readUrlState, useUrlState } from '../../lib/url-state';

export async function loader({ request }: { request: Request }) {
  const q = readUrlState(reviewQueueQuerySchema, new URL(request.url).searchParams);
  await queryClient.ensureQueryData(queueQueryOptions(q.apprenticeId ?? '', q.kind ?? ''));
  return null;
}

/** /mentorship/review: one queue of everything the mentor's apprentices sent. */
export function ReviewPage() {
  const [view, setView] = useUrlState(reviewQueueQuerySchema);
  return (
    <div className="space-y-6">
      <PageTitle>Review</PageTitle>
      <PageHeader title="Review" lead="Chores, weigh-ins, notes, litter counts and task ticks your apprentices sent, oldest first." />
      <ReviewQueue
        apprenticeId={view.apprenticeId ?? ''}
        kind={view.kind ?? ''}
        onFilter={(patch) => setView({
          ...(patch.apprenticeId !== undefined ? { apprenticeId: patch.apprenticeId || undefined } : {}),
          ...(patch.kind !== undefined ? { kind: (patch.kind || undefined) as typeof view.kind } : {}),
        })}
      />
    </div>
  );
}
