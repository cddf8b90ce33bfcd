import { queryClient } from '../../app/query-client';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { apprenticeQueryOptions, homeQueryOptions, useApprentice, useMentorshipHome } from '../../features/mentorship/api/mentorship-queries';
import { ApprenticeView } from '../../features/mentorship/components/apprentice-view';
import { useSession } from '../../lib/session';

export async function loader() {
  await queryClient.ensureQueryData(homeQueryOptions());
  return null;
}

/** /mentorship/skills: the apprentice's own checklist, progress and hours, and her record of skills. */
export function MySkillsPage() {
  const { user } = useSession();
  const page = useApprentice(user.id);
  const home = useMentorshipHome();
  void queryClient.prefetchQuery(apprenticeQueryOptions(user.id));
  return (
    <div className="space-y-6">
      <PageTitle>My skills</PageTitle>
      <PageHeader title="My skills" lead="Your mentor signs off each skill when you can do it on your own." />
      {page.data && home.data ? <ApprenticeView page={page.data} today={home.data.today ?? ''} showEntries={false} /> : <Spinner label="Loading your skills" />}
    </div>
  );
}
