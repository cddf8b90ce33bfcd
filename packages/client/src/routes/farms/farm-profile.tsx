import { ArrowLeft, Pencil } from 'lucide-react';
import { useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { queryClient } from '../../app/query-client';
import { farmDetailQueryOptions, useFarm } from '../../features/farms/api/get-farm';
import { FarmProfile } from '../../features/farms/components/farm-profile';
import { useCanEditFarm } from '../../features/farms/hooks/use-can-edit-farm';
import { farmIdFrom, useFarmIdParam } from './farm-id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(farmDetailQueryOptions(farmIdFrom(params)));
  return null;
}

export function FarmProfilePage() {
  const { data: farm } = useFarm(useFarmIdParam());
  const canEdit = useCanEditFarm(farm.id);
  const justSaved = (useLocation().state as { saved?: boolean } | null)?.saved === true;

  return (
    <div className="space-y-6">
      <PageTitle>{farm.name}</PageTitle>
      <LinkButton to="/" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to Commons
      </LinkButton>
      <PageHeader
        title={farm.name}
        lead={farm.location}
        actions={
          canEdit && (
            <LinkButton to={`/farms/${farm.id}/edit`} variant="primary">
              <Pencil className="size-4" aria-hidden="true" />
              Edit profile
            </LinkButton>
          )
        }
      />
      {justSaved && <Alert tone="success">Profile saved. Everyone in the co-op sees the new version now.</Alert>}
      <FarmProfile farm={farm} />
    </div>
  );
}
