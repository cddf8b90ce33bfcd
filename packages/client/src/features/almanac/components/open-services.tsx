import { Link, useSearchParams } from 'react-router-dom';
import { serviceListQuerySchema, type ServiceListItemDto } from '@burrowline/shared';
import { Pagination } from '../../../components/ui/data-table';
import { Badge } from '../../../components/ui/badge';
import { animalName } from '../../../lib/names';
import { Card } from '../../../components/ui/card';
import { useServices } from '../api/get-services';
import { formatDate } from '../../../lib/days';

const kindlingWords: Record<NonNullable<ServiceListItemDto['kindlingStatus']>, { label: string; tone: 'neutral' | 'straw' | 'clay' }> = {
  not_due: { label: 'Kindling not due yet', tone: 'neutral' },
  in_window: { label: 'In the kindling window', tone: 'straw' },
  overdue: { label: 'Kindling overdue', tone: 'clay' },
  missed: { label: 'Past the window', tone: 'clay' },
};

function pageFrom(value: string | null): number {
  const page = Number(value);
  return Number.isInteger(page) && page >= 1 ? page : 1;
}

/** The farm's open services, each a link to record its palpation, kindling or closing. */
export function OpenServices() {
  // Its page sits in the address beside the agenda's own state, so a reload keeps it.
  const [params, setParams] = useSearchParams();
  const query = serviceListQuerySchema.parse({ status: 'open', pageSize: 20, page: pageFrom(params.get('servicesPage')) });
  const services = useServices(query);
  const list = services.data?.items ?? [];
  if (list.length === 0) return null;
  const onPage = (page: number) =>
    setParams((current) => {
      const next = new URLSearchParams(current);
      if (page > 1) next.set('servicesPage', String(page));
      else next.delete('servicesPage');
      return next;
    }, { preventScrollReset: true });
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Services waiting for kits</h2>
      <ul className="divide-y divide-grey-200">
        {list.map((s) => {
          const status = s.kindlingStatus ? kindlingWords[s.kindlingStatus] : null;
          return (
            <li key={s.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <Link to={`/almanac/services/${s.id}`} className="inline-flex min-h-11 items-center font-semibold text-moss-deep underline-offset-4 hover:underline">
                {animalName(s.doe)} × {animalName(s.buck)}
              </Link>
              <span className="flex flex-wrap items-center gap-2 text-sm text-grey-600">
                served {formatDate(s.servicedOn)}
                {s.lastPalpation && <Badge tone={s.lastPalpation === 'positive' ? 'moss' : 'clay'}>{s.lastPalpation === 'positive' ? 'Palpated positive' : 'Palpated empty'}</Badge>}
                {status && <Badge tone={status.tone}>{status.label}</Badge>}
              </span>
            </li>
          );
        })}
      </ul>
      <Pagination page={query.page} pageSize={query.pageSize} total={services.data?.total ?? 0} noun="services waiting for kits" onPage={onPage} />
    </Card>
  );
}
