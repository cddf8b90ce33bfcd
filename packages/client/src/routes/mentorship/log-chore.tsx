import { Navigate } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Card } from '../../components/ui/card';
import { Spinner } from '../../components/ui/spinner';
import { choicesQueryOptions, homeQueryOptions, useChoreChoices, useMentorshipHome } from '../../features/mentorship/api/mentorship-queries';
import { LogChoreForm } from '../../features/mentorship/components/log-chore-form';

export async function loader() {
  await Promise.all([queryClient.ensureQueryData(homeQueryOptions()), queryClient.prefetchQuery(choicesQueryOptions())]);
  return null;
}

/** /mentorship: the apprentice logs a chore; a mentor or the admin goes on to the queue or the apprentices. */
export function LogChorePage() {
  const home = useMentorshipHome();
  const choices = useChoreChoices();
  if (!home.data) return <Spinner label="Loading" />;
  if (home.data.role === 'mentor') return <Navigate to="/mentorship/review" replace />;
  if (home.data.role !== 'apprentice') return <Navigate to="/mentorship/apprentices" replace />;
  return (
    <div className="space-y-6">
      <PageTitle>Log a chore</PageTitle>
      <PageHeader title="Log a chore" lead="Your mentor reviews it; a weight or a count counts once accepted." />
      <Card>
        {choices.data && home.data.today ? (
          <LogChoreForm kinds={home.data.choreKinds} today={home.data.today} choices={choices.data} />
        ) : (
          <Spinner label="Loading" />
        )}
      </Card>
    </div>
  );
}
