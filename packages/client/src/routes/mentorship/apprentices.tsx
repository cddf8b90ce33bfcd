import { queryClient } from '../../app/query-client';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { apprenticesQueryOptions, useApprentices } from '../../features/mentorship/api/mentorship-queries';
import { ApprenticeList } from '../../features/mentorship/components/apprentice-list';
import { useSession } from '../../lib/session';

export async function loader() {
  await queryClient.ensureQueryData(apprenticesQueryOptions());
  return null;
}

/** /mentorship/apprentices: a mentor's apprentices, or every apprentice of the co-op for the admin. */
export function ApprenticesPage() {
  const { user } = useSession();
  const list = useApprentices();
  return (
    <div className="space-y-6">
      <PageTitle>Apprentices</PageTitle>
      <PageHeader
        title="Apprentices"
        lead={user.role === 'admin' ? "Every apprentice of the co-op, to help; each one's mentor reviews and signs off." : 'Your apprentices: their skills and hours.'}
      />
      {list.data ? <ApprenticeList items={list.data.items} /> : <Spinner label="Loading apprentices" />}
    </div>
  );
}
