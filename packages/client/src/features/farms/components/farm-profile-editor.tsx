import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { FarmDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { PageHeader } from '../../../components/ui/page-header';
import { PageTitle } from '../../../components/ui/page-title';
import { farmDetailQueryOptions, useFarm } from '../api/get-farm';
import { useCanEditFarm } from '../hooks/use-can-edit-farm';
import { FarmCoordinatesForm } from './farm-coordinates-form';
import { FarmProfileForm } from './farm-profile-form';

/**
 * Holds the version the edit started from. Live updates refresh `latest` in the cache, but the
 * form keeps the starting point until the person chooses to reload, so typing is never lost silently.
 */
export function FarmProfileEditor({ farmId }: { farmId: string }) {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const { data: latest } = useFarm(farmId);
  const [startingPoint, setStartingPoint] = useState<FarmDto>(latest);
  const [isReloading, setIsReloading] = useState(false);
  const canEdit = useCanEditFarm(farmId);

  const reload = async () => {
    setIsReloading(true);
    try {
      setStartingPoint(await queryClient.fetchQuery({ ...farmDetailQueryOptions(farmId), staleTime: 0 }));
    } finally {
      setIsReloading(false);
    }
  };

  return (
    <div className="space-y-6">
      <PageTitle>{`Edit ${startingPoint.name}`}</PageTitle>
      <PageHeader title="Edit farm profile" lead={startingPoint.name} />
      {canEdit ? (
        <>
          <Card>
            <FarmProfileForm
              key={startingPoint.version}
              farm={startingPoint}
              latestVersion={latest.version}
              onReload={() => void reload()}
              isReloading={isReloading}
              onSaved={(saved) => void navigate(`/farms/${saved.id}`, { state: { saved: true } })}
            />
          </Card>
          <Card>
            <FarmCoordinatesForm farm={latest} />
          </Card>
        </>
      ) : (
        <Alert
          tone="error"
          title="You can't edit this profile"
          actions={<LinkButton to={`/farms/${farmId}`}>Back to the profile</LinkButton>}
        >
          Only the members of a farm can change its profile.
        </Alert>
      )}
    </div>
  );
}
