import { ArrowLeft } from 'lucide-react';
import { useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Badge } from '../../components/ui/badge';
import { Card } from '../../components/ui/card';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { serviceQueryOptions, useService } from '../../features/almanac/api/get-service';
import { formatDate } from '../../lib/days';
import { CloseServiceForm } from '../../features/almanac/components/close-service-form';
import { animalName } from '../../lib/names';
import { PalpationForm } from '../../features/almanac/components/palpation-form';
import { TaskItem } from '../../features/almanac/components/task-item';
import { useAlmanacRights } from '../../features/almanac/hooks/use-almanac-rights';
import { KindlingForm } from '../../features/litters/components/kindling-form';
import { idFrom, useIdParam } from './id-param';

export async function loader({ params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(serviceQueryOptions(idFrom(params, 'serviceId')));
  return null;
}

// Never "open": to a breeder an open doe is one not bred.
const statusWords = { open: 'Waiting for kits', kindled: 'Kindled', empty: 'Palpated empty', missed: 'Closed as missed' } as const;

export function ServiceDetailPage() {
  const { data: service } = useService(useIdParam('serviceId'));
  const rights = useAlmanacRights();
  const recorded = (useLocation().state as { recorded?: boolean } | null)?.recorded === true;
  const farmToday = todayFrom(service);
  const title = `${animalName(service.doe)} × ${animalName(service.buck)}`;

  return (
    <div className="space-y-6">
      <PageTitle>{`Service · ${title}`}</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader
        title={title}
        lead={`Served ${formatDate(service.servicedOn)}${service.status === 'open' ? ` · day ${service.dayToday}` : ''}`}
        actions={<Badge tone={service.status === 'open' ? 'straw' : service.status === 'kindled' ? 'moss' : 'neutral'}>{statusWords[service.status]}</Badge>}
      />
      {recorded && <Alert tone="success">Service saved. The Almanac planned its tasks below.</Alert>}
      {service.warnings.length > 0 && (
        <Alert tone="warning" title="Saved despite a warning">
          <ul className="list-disc pl-5">
            {service.warnings.map((w) => (
              <li key={w.code}>{w.message}</li>
            ))}
          </ul>
        </Alert>
      )}
      {service.closeReason && service.status !== 'open' && <Alert tone="info">{service.closeReason}</Alert>}
      {service.litterId && (
        <LinkButton to={`/litters/${service.litterId}`} variant="primary">
          Open the litter
        </LinkButton>
      )}
      <section aria-labelledby="service-tasks" className="space-y-2">
        <h2 id="service-tasks" className="text-xl font-bold">
          Tasks
        </h2>
        <ul className="space-y-2">
          {service.tasks.map((t) => (
            <TaskItem key={t.id} task={t} showDate showSource={false} />
          ))}
        </ul>
      </section>
      {service.palpations.length > 0 && (
        <section aria-labelledby="service-palpations" className="space-y-2">
          <h2 id="service-palpations" className="text-xl font-bold">
            Palpations
          </h2>
          <ul className="space-y-1">
            {service.palpations.map((p) => (
              <li key={p.id}>
                {formatDate(p.palpatedOn)} (day {p.dayAfterService}): <strong>{p.result === 'positive' ? 'positive' : p.result === 'negative' ? 'empty' : 'not sure'}</strong>
                {p.notes ? ` — ${p.notes}` : ''}
                {p.reviewState === 'pending' && (
                  <>
                    {' '}
                    <Badge tone="straw">Unverified: waiting for review</Badge>
                  </>
                )}
              </li>
            ))}
          </ul>
        </section>
      )}
      {rights.canPlan && service.status === 'open' && (
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Record the palpation</h2>
          <PalpationForm service={service} today={farmToday} />
        </Card>
      )}
      {rights.canRecordLitters && service.status !== 'kindled' && (
        <Card className="space-y-4">
          <h2 className="text-xl font-bold">Record the kindling</h2>
          <p className="text-grey-700">Everything after the kindling (nest box out, weigh-ins, weaning, breeding back) is planned from the day she kindles.</p>
          <KindlingForm serviceId={service.id} today={farmToday} />
        </Card>
      )}
      {rights.canPlan && service.status === 'open' && (
        <details className="rounded-2xl border border-grey-200 bg-white p-5">
          <summary className="min-h-11 cursor-pointer font-semibold">She did not kindle: close the service</summary>
          <div className="mt-4">
            <CloseServiceForm service={service} today={farmToday} />
          </div>
        </details>
      )}
    </div>
  );
}

/** The farm's today, from the day count the server gives (it knows the farm's clock). */
function todayFrom(service: { servicedOn: string; dayToday: number }): string {
  const [y, m, d] = service.servicedOn.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + service.dayToday)).toISOString().slice(0, 10);
}
