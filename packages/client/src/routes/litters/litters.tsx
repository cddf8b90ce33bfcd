import { ArrowLeft } from 'lucide-react';
import { useSearchParams } from 'react-router-dom';
import { countOf, type LitterListItemDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Badge } from '../../components/ui/badge';
import { RowLink } from '../../components/ui/data-table';
import { LinkButton } from '../../components/ui/link-button';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { formatDate } from '../../lib/days';
import { animalName } from '../../lib/names';
import { littersQueryOptions, useLitters } from '../../features/litters/api/get-litters';

type Status = 'nursing' | 'weaned' | 'all';

export async function loader() {
  await queryClient.ensureQueryData(littersQueryOptions({ status: 'all' }));
  return null;
}

function Row({ l }: { l: LitterListItemDto }) {
  return (
    <tr className="border-t border-grey-200">
      <td className="px-4 py-2">
        <RowLink to={`/litters/${l.id}`}>{animalName(l.dam)}</RowLink>
      </td>
      <td className="px-4 py-2">{animalName(l.sire)}</td>
      <td className="px-4 py-2">{formatDate(l.kindledOn)}</td>
      <td className="px-4 py-2 text-right">{l.ageDays}</td>
      <td className="px-4 py-2 text-right">{l.bornAlive}</td>
      <td className="px-4 py-2 text-right font-semibold">{l.onDoe}</td>
      <td className="px-4 py-2 text-right">{l.weaned}</td>
      <td className="px-4 py-2">
        <Badge tone={l.status === 'nursing' ? 'straw' : 'neutral'}>{l.status === 'nursing' ? 'With the doe' : 'Weaned'}</Badge>
      </td>
    </tr>
  );
}

export function LittersPage() {
  const [params, setParams] = useSearchParams();
  const status = (['nursing', 'weaned', 'all'].includes(params.get('status') ?? '') ? params.get('status') : 'all') as Status;
  const { data } = useLitters({ status: 'all' });
  const litters = data.litters.filter((l) => status === 'all' || l.status === status);
  const count = (s: Status) => data.litters.filter((l) => s === 'all' || l.status === s).length;
  return (
    <div className="space-y-6">
      <PageTitle>Litters</PageTitle>
      <LinkButton to="/almanac" variant="quiet" className="-ml-4">
        <ArrowLeft className="size-4" aria-hidden="true" />
        Back to the Almanac
      </LinkButton>
      <PageHeader title="Litters" lead="Every kindling, with the kits still on the doe. Counts follow from the dated events." />
      <SegmentedFilter
        label="Show"
        value={status}
        onChange={(s) => setParams(s === 'all' ? {} : { status: s }, { replace: true })}
        options={[
          { value: 'nursing', label: 'With the doe', count: count('nursing') },
          { value: 'weaned', label: 'Weaned', count: count('weaned') },
          { value: 'all', label: 'All', count: count('all') },
        ]}
      />
      {litters.length === 0 ? (
        <p className="rounded-2xl border border-dashed border-grey-300 bg-white p-8 text-center text-grey-600">No litters here yet.</p>
      ) : (
        <>
          <div className="hidden overflow-x-auto rounded-2xl border border-grey-200 bg-white shadow-sm md:block">
            <table className="w-full text-left">
              <caption className="sr-only">Litters</caption>
              <thead className="bg-grey-50 text-sm text-grey-600">
                <tr>
                  <th className="px-4 py-2">Dam</th>
                  <th className="px-4 py-2">Sire</th>
                  <th className="px-4 py-2">Kindled</th>
                  <th className="px-4 py-2 text-right">Age (days)</th>
                  <th className="px-4 py-2 text-right">Born alive</th>
                  <th className="px-4 py-2 text-right">With the doe</th>
                  <th className="px-4 py-2 text-right">Weaned</th>
                  <th className="px-4 py-2">Status</th>
                </tr>
              </thead>
              <tbody>
                {litters.map((l) => (
                  <Row key={l.id} l={l} />
                ))}
              </tbody>
            </table>
          </div>
          <ul className="space-y-3 md:hidden">
            {litters.map((l) => (
              <li key={l.id} className="relative rounded-2xl border border-grey-200 bg-white p-4 shadow-sm">
                <RowLink to={`/litters/${l.id}`} cover>
                  {animalName(l.dam)}
                </RowLink>
                <p className="text-sm text-grey-600">
                  by {animalName(l.sire)} · kindled {formatDate(l.kindledOn)} · {countOf(l.ageDays, 'day')}
                </p>
                <p className="mt-1 flex flex-wrap items-center gap-2">
                  <span>
                    <strong>{l.onDoe}</strong> with the doe · {l.bornAlive} born alive · {l.weaned} weaned
                  </span>
                  <Badge tone={l.status === 'nursing' ? 'straw' : 'neutral'}>{l.status === 'nursing' ? 'With the doe' : 'Weaned'}</Badge>
                </p>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}
