import { ArrowLeft, Scale } from 'lucide-react';
import { countOf } from '@burrowline/shared';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { useSession } from '../../lib/session';
import { formatDate } from '../../lib/days';
import { useWithdrawals } from '../../features/health/api/get-withdrawals';
import { MarkForProcessing } from '../../features/processing/components/mark-for-processing';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { groupQueryOptions, useGroup } from '../../features/grow-out/api/get-group';
import { GrowthChart } from '../../features/grow-out/components/growth-chart';
import { CloseGroupForm, FeedPanel, GainsPanel, GroupWeighInForm, GroupWeighInsList, ProjectionCard, WeighInSchedule } from '../../features/grow-out/components/group-panels';
import { weighingRoundLink } from '../../features/weighing-rounds';
import { weight } from '../../lib/weights';
import { idFrom, useIdParam } from '../almanac/id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(groupQueryOptions(idFrom(params, 'groupId')));
  return null;
}

/** /grow-out/groups/:groupId: make-up, growth chart, projection, weigh-ins, feed conversion. */
export function GroupDetailPage() {
  const groupId = useIdParam('groupId');
  const { data: group } = useGroup(groupId);
  const unit = useWeightUnit();
  const { user } = useSession();
  const isApprentice = user.role === 'apprentice';
  // Health's withdrawal periods (over HTTP: grow-out imports nothing of health on the server).
  const withdrawals = useWithdrawals({ groupId });
  const longest = withdrawals.data?.withdrawals[0];
  return (
    <div className="space-y-6">
      <PageTitle>{group.name}</PageTitle>
      <LinkButton to="/grow-out" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the groups
      </LinkButton>
      <PageHeader
        title={group.name}
        lead={`${countOf(group.currentHeads, 'head')} · ${countOf(group.ageDays, 'day')} old · ${group.crossLabel} · formed ${formatDate(group.formedOn)}${group.housingUnit ? ` · in ${group.housingUnit.name}` : ''}`}
        actions={group.status === 'closed' ? <Badge>Closed {group.closedOn ? formatDate(group.closedOn) : ''}</Badge> : <Badge tone="moss">Growing</Badge>}
      />
      {longest && (
        <Alert tone="warning" title={`Under withdrawal until ${formatDate(longest.withdrawalEndsOn)}`}>
          {longest.treatment}, set by {longest.veterinarian}: not for processing before {formatDate(longest.clearFrom)}.
        </Alert>
      )}
      {group.pendingWeighIns > 0 && (
        <Alert tone="info">{group.pendingWeighIns} weigh-in{group.pendingWeighIns === 1 ? '' : 's'} by an apprentice wait{group.pendingWeighIns === 1 ? 's' : ''} for review; they count once accepted.</Alert>
      )}
      <div className="grid gap-6 lg:grid-cols-3">
        <Card className="lg:col-span-2">
          <h2 className="mb-2 text-lg font-semibold">Growth</h2>
          <GrowthChart chart={group.chart} unit={unit} />
        </Card>
        <Card>
          <ProjectionCard group={group} unit={unit} />
        </Card>
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        <Card>
          <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
            <h2 className="text-lg font-semibold">Weigh the group</h2>
            {group.status === 'growing' && (
              <LinkButton to={weighingRoundLink({ groupId: group.id })} variant="secondary">
                <Scale className="size-5" aria-hidden="true" />
                Weigh kit by kit
              </LinkButton>
            )}
          </div>
          <WeighInSchedule group={group} />
          {group.status === 'growing' ? <GroupWeighInForm group={group} unit={unit} isApprentice={isApprentice} /> : <p className="text-grey-600">The group is closed.</p>}
        </Card>
        <Card className="space-y-6">
          <GainsPanel group={group} unit={unit} />
          <FeedPanel group={group} unit={unit} />
        </Card>
      </div>
      <div className="grid gap-6 lg:grid-cols-2">
        <Card>
          <h2 className="mb-2 text-lg font-semibold">Weigh-ins</h2>
          <GroupWeighInsList group={group} unit={unit} />
        </Card>
        <Card className="space-y-4">
          <h2 className="text-lg font-semibold">Make-up</h2>
          <ul className="space-y-2">
            {group.litters.map((l) => (
              <li key={l.litterId}>
                <TextLink to={`/litters/${l.litterId}`}>{l.heads} from {l.dam.name} × {l.sire.name}</TextLink>
                <span className="block text-sm text-grey-600">kindled {formatDate(l.kindledOn)} · {l.cross.label}</span>
              </li>
            ))}
          </ul>
          <p className="text-sm text-grey-600">Target {weight(group.targetGrams, unit)} a head. Ages count from {formatDate(group.birthDate)}, the kindling dates weighted by heads.</p>
          {group.canEdit && group.status === 'growing' && <CloseGroupForm group={group} />}
          {group.canEdit && group.status === 'growing' && withdrawals.data && (
            <div className="space-y-2 border-t border-grey-200 pt-4">
              <h3 className="font-semibold">Processing day</h3>
              <MarkForProcessing groupId={group.id} today={withdrawals.data.today} />
            </div>
          )}
        </Card>
      </div>
    </div>
  );
}
