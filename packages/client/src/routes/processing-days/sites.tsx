import { ArrowLeft, Droplets, Snowflake } from 'lucide-react';
import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { queryClient } from '../../app/query-client';
import { Badge } from '../../components/ui/badge';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { TextLink } from '../../components/ui/text-link';
import { farmsListQueryOptions } from '../../features/farms/api/get-farms';
import { sitesQueryOptions, useSites } from '../../features/processing-days/api/get-processing-days';
import { SiteForm } from '../../features/processing-days/components/site-form';
import { waterLabels } from '../../features/processing-days/processing-days-format';

export async function loader() {
  await Promise.all([queryClient.ensureQueryData(sitesQueryOptions()), queryClient.ensureQueryData(farmsListQueryOptions())]);
  return null;
}

/** /processing-days/sites — the co-op's processing sites (admin): capacity, chill, water, and whether the host may schedule. */
export function SitesPage() {
  const { data: sites = [] } = useSites();
  const { data: farms = [] } = useQuery(farmsListQueryOptions());
  const [editing, setEditing] = useState<string | null>(null);
  const farmOptions = farms.map((f) => ({ id: f.id, name: f.name }));
  return (
    <div className="space-y-6">
      <PageTitle>Processing sites</PageTitle>
      <TextLink to="/processing-days"><ArrowLeft className="mr-1 size-4" aria-hidden="true" />All processing days</TextLink>
      <PageHeader title="Sites" lead="Where the co-op processes: what each site takes in a day and holds in its chill." />
      <ul className="grid gap-4 md:grid-cols-2">
        {sites.map((site) => (
          <li key={site.id}>
            <Card className="space-y-2">
              {editing === site.id ? (
                <SiteForm farms={farmOptions} site={site} onDone={() => setEditing(null)} />
              ) : (
                <>
                  <div className="flex flex-wrap items-center justify-between gap-2">
                    <h2 className="text-lg font-bold">{site.name}</h2>
                    {site.hostMaySchedule && <Badge tone="moss">Host may schedule</Badge>}
                  </div>
                  <p className="text-grey-700">{site.hostFarmName} · {site.address}</p>
                  <p className="flex flex-wrap gap-x-4 gap-y-1">
                    <span className="font-semibold">{site.capacityHeadPerDay} head a day</span>
                    <span className="inline-flex items-center gap-1.5"><Snowflake className="size-4" aria-hidden="true" />chill {site.chillCapacityHead}</span>
                    <span className="inline-flex items-center gap-1.5"><Droplets className="size-4" aria-hidden="true" />{waterLabels[site.water]}</span>
                  </p>
                  {site.notes && <p className="text-sm text-grey-700">{site.notes}</p>}
                  <Button variant="secondary" onClick={() => setEditing(site.id)}>Edit</Button>
                </>
              )}
            </Card>
          </li>
        ))}
      </ul>
      <Card className="space-y-4">
        <h2 className="text-lg font-bold">Add a site</h2>
        <SiteForm farms={farmOptions} />
      </Card>
    </div>
  );
}
