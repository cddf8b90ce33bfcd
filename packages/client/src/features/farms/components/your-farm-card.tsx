import { Pencil, Warehouse } from 'lucide-react';
import type { FarmDto } from '@burrowline/shared';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { useCanEditFarm } from '../hooks/use-can-edit-farm';
import { FarmFacts } from './farm-facts';
import { MemberList } from './member-list';

export function YourFarmCard({ farm }: { farm: FarmDto }) {
  const canEdit = useCanEditFarm(farm.id);
  return (
    <Card className="space-y-5">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="space-y-1">
          <h2 className="flex items-center gap-2 text-sm font-semibold tracking-wide text-moss-deep uppercase">
            <Warehouse className="size-4" aria-hidden="true" />
            Your farm
          </h2>
          <p className="text-2xl font-bold">{farm.name}</p>
        </div>
        <div className="flex flex-wrap gap-3">
          <LinkButton to={`/farms/${farm.id}`} variant="quiet">
            View profile
          </LinkButton>
          {canEdit && (
            <LinkButton to={`/farms/${farm.id}/edit`} variant="primary">
              <Pencil className="size-4" aria-hidden="true" />
              Edit profile
            </LinkButton>
          )}
        </div>
      </div>
      <div className="grid gap-5 lg:grid-cols-3">
        <div className="lg:col-span-2">
          <FarmFacts farm={farm} />
        </div>
        <div className="space-y-2">
          <h3 className="text-sm font-medium text-grey-600">Members</h3>
          <MemberList members={farm.members} />
        </div>
      </div>
    </Card>
  );
}

export function NoFarmCard() {
  return (
    <Card className="space-y-2">
      <h2 className="text-sm font-semibold tracking-wide text-moss-deep uppercase">Your farm</h2>
      <p>Your account is not attached to a farm yet. Ask your co-op's coordinator to add you to one.</p>
    </Card>
  );
}
