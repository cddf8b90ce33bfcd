import { useNavigate } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { farmsListQueryOptions, useFarms } from '../../features/farms/api/get-farms';
import { InviteForm } from '../../features/members/components/invite-form';

export async function loader() {
  await queryClient.ensureQueryData(farmsListQueryOptions());
  return null;
}

export function InviteMemberPage() {
  const { data: farms } = useFarms();
  const navigate = useNavigate();
  return (
    <div className="space-y-6">
      <PageTitle>Invite someone</PageTitle>
      <PageHeader title="Invite someone" lead="For people you have already vetted; everyone else can apply on the co-op's form." />
      <Card>
        <InviteForm farms={farms} onInvited={(member) => void navigate(`/admin/members/${member.id}`, { state: { invited: true } })} />
      </Card>
    </div>
  );
}
