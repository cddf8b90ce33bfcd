import { ArrowLeft } from 'lucide-react';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { LinkButton } from '../../components/ui/link-button';
import { PageTitle } from '../../components/ui/page-title';
import { applicationQueryOptions, useApplication } from '../../features/applications/api/get-application';
import { ApplicationDetail } from '../../features/applications/components/application-detail';
import { uuidParam } from './id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(applicationQueryOptions(uuidParam(params, 'applicationId', 'application')));
  return null;
}

export function ApplicationDetailPage() {
  const { data: application } = useApplication(useParams().applicationId ?? '');
  return (
    <div className="space-y-4">
      <PageTitle>{`Application: ${application.applicantName}`}</PageTitle>
      <LinkButton to="/admin/applications" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        All applications
      </LinkButton>
      <ApplicationDetail application={application} />
    </div>
  );
}
