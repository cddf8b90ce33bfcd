import { ArrowLeft } from 'lucide-react';
import { Link, useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import { countOf, addDays } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { weighingRoundLink } from '../../features/weighing-rounds';
import { PageTitle } from '../../components/ui/page-title';
import { formatDate } from '../../lib/days';
import { animalName } from '../../lib/names';
import { TaskItem } from '../../features/almanac/components/task-item';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';
import { litterQueryOptions, useLitter } from '../../features/litters/api/get-litter';
import { FosteringForm } from '../../features/litters/components/fostering-form';
import { KeeperForm } from '../../features/litters/components/keeper-form';
import { KitCountChart } from '../../features/litters/components/kit-count-chart';
import { LitterEventForm } from '../../features/litters/components/litter-event-form';
import { LitterEventsList } from '../../features/litters/components/litter-events-list';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';
import { idFrom, useIdParam } from '../almanac/id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(litterQueryOptions(idFrom(params, 'litterId')));
  return null;
}

function Figure({ label, value, strong = false }: { label: string; value: number; strong?: boolean }) {
  return (
    <div className={strong ? 'rounded-xl bg-moss p-3 text-white' : 'rounded-xl bg-grey-50 p-3'}>
      <dt className={strong ? 'text-sm text-oat/90' : 'text-sm text-grey-600'}>{label}</dt>
      <dd className="text-2xl font-bold">{value}</dd>
    </div>
  );
}

export function LitterDetailPage() {
  const { data: litter } = useLitter(useIdParam('litterId'));
  const rights = useAlmanacRights();
  const unit = useWeightUnit();
  const kindled = (useLocation().state as { kindled?: boolean } | null)?.kindled === true;
  const today = addDays(litter.kindledOn, litter.ageDays);
  const s = litter.summary;
  const title = `Litter of ${animalName(litter.dam)}`;

  return (
    <div className="space-y-6">
      <PageTitle>{title}</PageTitle>
      <LinkButton to="/litters" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        All litters
      </LinkButton>
      <PageHeader
        title={title}
        lead={`By ${animalName(litter.sire)} · kindled ${formatDate(litter.kindledOn)} (served ${formatDate(litter.servicedOn)}) · ${countOf(litter.ageDays, 'day')} old`}
        actions={(
          <>
            <Badge tone={litter.status === 'nursing' ? 'straw' : 'neutral'}>{litter.status === 'nursing' ? 'With the doe' : 'Weaned'}</Badge>
            <LinkButton to={weighingRoundLink({ litterId: litter.id })} variant="secondary">Weigh the kits</LinkButton>
          </>
        )}
      />
      {kindled && <Alert tone="success">Kindling saved. Nest box out, weigh-ins, weaning and breeding back are planned from {formatDate(litter.kindledOn)}.</Alert>}
      <Card className="space-y-4">
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-7">
          <Figure label="With the doe" value={s.onDoe} strong />
          <Figure label="Born alive" value={s.bornAlive} />
          <Figure label="Born dead" value={s.bornDead} />
          <Figure label="Fostered in" value={s.fosteredIn} />
          <Figure label="Fostered out" value={s.fosteredOut} />
          <Figure label="Lost or culled" value={s.lost + s.culled} />
          <Figure label="Weaned" value={s.weaned} />
        </dl>
        <p className="text-sm text-grey-600">
          With the doe = born alive + fostered in − fostered out − lost − culled − weaned. Fostering never changes a kit's parents.
          {litter.housing ? ` Housed in ${litter.housing.unitName} since ${formatDate(litter.housing.placedOn)}.` : ''}
        </p>
        <KitCountChart history={litter.countHistory} today={today} />
      </Card>
      <section aria-labelledby="litter-tasks" className="space-y-2">
        <h2 id="litter-tasks" className="text-xl font-bold">
          Tasks
        </h2>
        <ul className="space-y-2">
          {litter.tasks.map((t) => (
            <TaskItem key={t.id} task={t} showDate showSource={false} />
          ))}
        </ul>
        <p className="text-sm">
          <Link to={`/almanac/services/${litter.serviceId}`} className="font-medium text-moss-deep underline underline-offset-4">
            The service this litter came from
          </Link>
        </p>
      </section>
      <Card className="space-y-3">
        <h2 className="text-xl font-bold">Changes of the kit count</h2>
        <LitterEventsList litter={litter} canReview={rights.canPlan} unit={unit} />
      </Card>
      {rights.canRecordCounts && litter.onDoe > 0 && (
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Weaned, lost or culled</h2>
          <LitterEventForm litter={litter} today={today} isApprentice={rights.isApprentice} unit={unit} />
        </Card>
      )}
      {rights.canRecordLitters && (
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Fostering</h2>
          <FosteringForm litter={litter} today={today} />
        </Card>
      )}
      <Card className="space-y-4">
        <h2 className="text-xl font-bold">Kept kits</h2>
        {litter.keepers.length === 0 ? (
          <p className="text-grey-600">None kept yet.</p>
        ) : (
          <ul className="space-y-1">
            {litter.keepers.map((k) => (
              <li key={k.id}>
                <strong>{animalName(k)}</strong> ({k.sex}){k.bornInLitterId !== litter.id ? ' · fostered in, its own parents' : ''}
                {k.farm && k.farm.id !== litter.farmId ? ` · now at ${k.farm.name}` : ''}
              </li>
            ))}
          </ul>
        )}
        {rights.canRecordLitters && <KeeperForm litter={litter} />}
      </Card>
    </div>
  );
}
