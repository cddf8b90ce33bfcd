import { ArrowLeft } from 'lucide-react';
import { useLocation, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageTitle } from '../../components/ui/page-title';
import { memberQueryOptions, useMember } from '../../features/members/api/get-member';
import { MemberDetail } from '../../features/members/components/member-detail';
import { uuidParam } from './id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(memberQueryOptions(uuidParam(params, 'userId', 'member')));
  return null;
}

export function MemberDetailPage() {
  const { data: member } = useMember(useParams().userId ?? '');
  const invited = (useLocation().state as { invited?: boolean } | null)?.invited === true;
  return (
    <div className="space-y-4">
      <PageTitle>{member.name}</PageTitle>
      <LinkButton to="/admin/members" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        All members
      </LinkButton>
      {invited && <Alert tone="success">Invitation sent to {member.email}.</Alert>}
      <MemberDetail member={member} />
    </div>
  );
}
