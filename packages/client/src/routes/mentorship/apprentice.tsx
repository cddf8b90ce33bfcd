import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { apprenticeQueryOptions, homeQueryOptions, useApprentice, useMentorshipHome } from '../../features/mentorship/api/mentorship-queries';
import { ApprenticeView } from '../../features/mentorship/components/apprentice-view';
import { TextLink } from '../../components/ui/text-link';

export async function loader({ params }: LoaderFunctionArgs) {
  await Promise.all([queryClient.ensureQueryData(apprenticeQueryOptions(params.apprenticeId!)), queryClient.ensureQueryData(homeQueryOptions())]);
  return null;
}

/** /mentorship/apprentices/:apprenticeId: one apprentice's skills, hours and entries. */
export function ApprenticePage() {
  const { apprenticeId } = useParams();
  const page = useApprentice(apprenticeId!);
  const home = useMentorshipHome();
  if (!page.data) return <Spinner label="Loading" />;
  return (
    <div className="space-y-6">
      <PageTitle>{page.data.name}</PageTitle>
      <PageHeader
        title={page.data.name}
        lead={<>{page.data.farm?.name}{page.data.waiting > 0 && <> · <TextLink to={`/mentorship/review?apprenticeId=${page.data.id}`}>{page.data.waiting} waiting for review</TextLink></>}</>}
      />
      <ApprenticeView page={page.data} today={home.data?.today ?? ''} />
    </div>
  );
}
