import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import {
  housingUnitCreateSchema,
  litterListQuerySchema,
  placementCreateSchema,
  type HousingKind,
  type HousingUnitCreateInput,
  type HousingUnitDto,
  type PlacementCreateInput,
} from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { TextLink } from '../../../components/ui/text-link';
import { breedingStockQueryOptions } from '../../almanac';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';
import { errorText } from '../../../lib/form-errors';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { littersQueryOptions } from '../api/get-litters';
import { useCreateHousingUnit, useEndPlacement, useHousingUnits, usePlaceInUnit } from '../api/housing';

const kindWords: Record<HousingKind, string> = { hutch: 'Hutch', pen: 'Pen', colony: 'Colony', grow_out: 'Grow-out pen' };

/** One select names an animal or a litter ("animal:<id>", "litter:<id>"); every placement error shows under it. */
const placementResolver = (today: string) =>
  sharedSchemaResolver<{ who: string }, PlacementCreateInput>(
    placementCreateSchema,
    ({ who }) => {
      const [type, id] = who.split(':');
      return { ...(type === 'animal' ? { animalId: id } : type === 'litter' ? { litterId: id } : {}), placedOn: today, note: '' };
    },
    () => 'who',
  );

// A farm nurses far fewer than fifty litters at once: the latest fifty are the ones to place.
const nursingLitters = litterListQuerySchema.parse({ status: 'nursing', pageSize: 50 });

function UnitCard({ unit, today, canEdit }: { unit: HousingUnitDto; today: string; canEdit: boolean }) {
  const stock = useQuery({ ...breedingStockQueryOptions(), enabled: canEdit });
  const litters = useQuery({ ...littersQueryOptions(nursingLitters), enabled: canEdit });
  const place = usePlaceInUnit();
  const end = useEndPlacement();
  const form = useForm<{ who: string }, unknown, PlacementCreateInput>({ resolver: placementResolver(today), defaultValues: { who: '' } });
  const { submit } = useServerSubmit(
    form,
    { mutate: (input: PlacementCreateInput, options) => place.mutate({ unitId: unit.id, input }, options), reset: place.reset, error: place.error },
    { fields: () => 'who', onSuccess: () => form.reset({ who: '' }) },
  );
  const options = [
    { value: '', label: 'Move in…' },
    ...[...(stock.data?.does ?? []), ...(stock.data?.bucks ?? [])].map((a) => ({ value: `animal:${a.id}`, label: animalName(a) })),
    ...(litters.data?.items ?? []).map((l) => ({ value: `litter:${l.id}`, label: `Litter of ${animalName(l.dam)}` })),
  ];
  const whoError = form.formState.errors.who?.message;
  return (
    <Card className="space-y-3">
      <div className="flex items-baseline justify-between gap-2">
        <h3 className="text-lg font-bold">{unit.name}</h3>
        <span className="text-sm text-grey-600">
          {kindWords[unit.kind]}
          {unit.capacity ? ` · ${unit.current.length} of ${unit.capacity}` : ''}
        </span>
      </div>
      {unit.current.length === 0 ? (
        <p className="text-grey-600">Empty.</p>
      ) : (
        <ul className="space-y-1">
          {unit.current.map((p) => (
            <li key={p.id} className="flex flex-wrap items-center justify-between gap-2">
              <span>
                {p.animal ? <TextLink to={`/herd/${p.animal.id}`}>{animalName(p.animal)}</TextLink> : p.litter ? <TextLink to={`/litters/${p.litter.id}`}>Litter of {animalName(p.litter.dam)}</TextLink> : ''} · since {formatDate(p.placedOn)}
              </span>
              {canEdit && (
                <Button variant="quiet" className="px-2" onClick={() => end.mutate({ placementId: p.id, input: { endedOn: today } })}>
                  Moved out today
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <form noValidate className="flex items-end gap-2" onSubmit={submit}>
          <SelectField label={`Move into ${unit.name}`} options={options} className="flex-1" error={whoError} {...form.register('who')} />
          <Button type="submit" variant="secondary" isBusy={place.isPending}>
            Move in
          </Button>
        </form>
      )}
      {(place.isError || end.isError) && (
        <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(place.error ?? end.error)}</p>
      )}
    </Card>
  );
}

/** The farm's hutches and pens, each with what is in it now and since when. */
export function HousingBoard({ today, canEdit }: { today: string; canEdit: boolean }) {
  const units = useHousingUnits();
  const create = useCreateHousingUnit();
  const form = useForm<{ name: string; kind: HousingKind }, unknown, HousingUnitCreateInput>({
    resolver: sharedSchemaResolver(housingUnitCreateSchema, (v) => ({ ...v, capacity: null, notes: '' })),
    defaultValues: { name: '', kind: 'hutch' },
  });
  const { errors } = form.formState;
  const { submit } = useServerSubmit(form, create, { onSuccess: () => form.reset({ ...form.getValues(), name: '' }) });
  return (
    <div className="space-y-6">
      {canEdit && (
        <Card>
          <form noValidate className="grid items-end gap-4 sm:grid-cols-[1fr_1fr_auto]" onSubmit={submit}>
            <TextField label="New hutch or pen" error={errors.name?.message} {...form.register('name')} />
            <SelectField label="Kind" options={Object.entries(kindWords).map(([value, label]) => ({ value, label }))} error={errors.kind?.message} {...form.register('kind')} />
            <Button type="submit" isBusy={create.isPending}>
              Add
            </Button>
          </form>
        </Card>
      )}
      <div className="grid gap-4 md:grid-cols-2 lg:grid-cols-3">
        {(units.data?.units ?? []).map((u) => (
          <UnitCard key={u.id} unit={u} today={today} canEdit={canEdit} />
        ))}
      </div>
      {units.data && units.data.units.length === 0 && <p className="text-grey-600">No hutches or pens yet.</p>}
    </div>
  );
}
