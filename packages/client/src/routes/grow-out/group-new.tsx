import { ArrowLeft } from 'lucide-react';
import { queryClient } from '../../app/query-client';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { Spinner } from '../../components/ui/spinner';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { groupsQueryOptions, useGroups } from '../../features/grow-out/api/get-groups';
import { litterChoicesQueryOptions } from '../../features/grow-out/api/get-litter-choices';
import { FormGroupForm } from '../../features/grow-out/components/form-group-form';

export async function loader() {
  await Promise.all([queryClient.ensureQueryData(litterChoicesQueryOptions()), queryClient.ensureQueryData(groupsQueryOptions({ status: 'growing' }))]);
  return null;
}

/** /grow-out/groups/new */
export function GroupNewPage() {
  const unit = useWeightUnit();
  const { data } = useGroups({ status: 'growing' });
  return (
    <div className="space-y-6">
      <PageTitle>Form a group</PageTitle>
      <LinkButton to="/grow-out" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the groups
      </LinkButton>
      <PageHeader title="Form a grow-out group" lead="Put kits of one or more litters together at weaning. A litter gives no more kits than it has alive and not already in a group." />
      <Card>{data ? <FormGroupForm unit={unit} defaultTargetGrams={data.defaultTargetGrams} /> : <Spinner />}</Card>
    </div>
  );
}
