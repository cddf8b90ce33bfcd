import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { ServiceListItemDto } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { animalName } from '../../../lib/names';
import { Card } from '../../../components/ui/card';
import { servicesQueryOptions } from '../api/get-services';
import { formatDate } from '../../../lib/days';

const kindlingWords: Record<NonNullable<ServiceListItemDto['kindlingStatus']>, { label: string; tone: 'neutral' | 'straw' | 'clay' }> = {
  not_due: { label: 'Kindling not due yet', tone: 'neutral' },
  in_window: { label: 'In the kindling window', tone: 'straw' },
  overdue: { label: 'Kindling overdue', tone: 'clay' },
  missed: { label: 'Past the window', tone: 'clay' },
};

/** The farm's open services, each a link to record its palpation, kindling or closing. */
export function OpenServices() {
  const services = useQuery(servicesQueryOptions({ status: 'open' }));
  const list = services.data?.services ?? [];
  if (list.length === 0) return null;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Open services</h2>
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
    </Card>
  );
}
