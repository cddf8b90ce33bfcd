import { useForm } from 'react-hook-form';
import { processingSiteCreateSchema, waterSupplies, type ProcessingSiteCreateInput, type ProcessingSiteDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useCreateSite, useUpdateSite } from '../api/processing-day-mutations';
import { waterLabels } from '../processing-days-format';

interface Values {
  name: string;
  hostFarmId: string;
  address: string;
  capacity: string;
  chill: string;
  water: ProcessingSiteCreateInput['water'];
  hostMaySchedule: boolean;
  notes: string;
}

const fields = { name: 'name', hostFarmId: 'hostFarmId', address: 'address', capacityHeadPerDay: 'capacity', chillCapacityHead: 'chill', water: 'water', hostMaySchedule: 'hostMaySchedule', notes: 'notes' } as const;
const fieldOf = (path: string) => fields[path.split('.')[0] as keyof typeof fields] ?? null;
const count = (text: string) => (text.trim() === '' ? Number.NaN : Number(text));

/** A site in the co-op's settings: where, how many head a day, how many the chill holds, the water, and whether its host may schedule. */
export function SiteForm({ farms, site, onDone }: { farms: { id: string; name: string }[]; site?: ProcessingSiteDto; onDone?: () => void }) {
  const create = useCreateSite();
  const update = useUpdateSite();
  const form = useForm<Values, unknown, ProcessingSiteCreateInput>({
    resolver: sharedSchemaResolver(
      processingSiteCreateSchema,
      (v) => ({ name: v.name, hostFarmId: v.hostFarmId, address: v.address, capacityHeadPerDay: count(v.capacity), chillCapacityHead: count(v.chill), water: v.water, hostMaySchedule: v.hostMaySchedule, notes: v.notes }),
      fieldOf,
    ),
    defaultValues: site
      ? { name: site.name, hostFarmId: site.hostFarmId, address: site.address, capacity: String(site.capacityHeadPerDay), chill: String(site.chillCapacityHead), water: site.water, hostMaySchedule: site.hostMaySchedule, notes: site.notes }
      : { name: '', hostFarmId: farms[0]?.id ?? '', address: '', capacity: '', chill: '', water: 'potable_mains', hostMaySchedule: false, notes: '' },
  });
  const mutation = site
    ? { ...update, mutate: (body: ProcessingSiteCreateInput, options?: Parameters<typeof update.mutate>[1]) => update.mutate({ ...body, siteId: site.id, version: site.version }, options) }
    : create;
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, mutation, {
    fields: fieldOf,
    onSuccess: () => {
      if (!site) form.reset();
      onDone?.();
    },
  });
  return (
    <form onSubmit={submit} noValidate aria-label={site ? `Edit ${site.name}` : 'Add a site'} className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Site name" error={errors.name?.message} {...form.register('name')} />
        <SelectField label="Host farm" error={errors.hostFarmId?.message} options={farms.map((f) => ({ value: f.id, label: f.name }))} {...form.register('hostFarmId')} />
        <TextField label="Capacity (head a day)" type="number" inputMode="numeric" min={1} error={errors.capacity?.message} {...form.register('capacity')} />
        <TextField label="Chill capacity (head at once)" type="number" inputMode="numeric" min={0} error={errors.chill?.message} {...form.register('chill')} />
        <SelectField label="Water" error={errors.water?.message} options={waterSupplies.map((w) => ({ value: w, label: waterLabels[w] }))} {...form.register('water')} />
      </div>
      <TextAreaField label="Address" rows={2} error={errors.address?.message} {...form.register('address')} />
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      <CheckboxField label="The host farm's members may schedule days here" error={errors.hostMaySchedule?.message} {...form.register('hostMaySchedule')} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" isBusy={site ? update.isPending : create.isPending}>{site ? 'Save the site' : 'Add the site'}</Button>
        {site && onDone && <Button variant="quiet" onClick={onDone}>Keep as it was</Button>}
      </div>
    </form>
  );
}
