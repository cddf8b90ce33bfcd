import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { HousingKind, HousingUnitDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { breedingStockQueryOptions } from '../../almanac';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';
import { errorText, fieldErrors } from '../../../lib/form-errors';
import { littersQueryOptions } from '../api/get-litters';
import { useCreateHousingUnit, useEndPlacement, useHousingUnits, usePlaceInUnit } from '../api/housing';

const kindWords: Record<HousingKind, string> = { hutch: 'Hutch', pen: 'Pen', colony: 'Colony', grow_out: 'Grow-out pen' };

function UnitCard({ unit, today, canEdit }: { unit: HousingUnitDto; today: string; canEdit: boolean }) {
  const stock = useQuery({ ...breedingStockQueryOptions(), enabled: canEdit });
  const litters = useQuery({ ...littersQueryOptions({ status: 'all' }), enabled: canEdit });
  const place = usePlaceInUnit();
  const end = useEndPlacement();
  const [who, setWho] = useState('');
  const options = [
    { value: '', label: 'Move in…' },
    ...[...(stock.data?.does ?? []), ...(stock.data?.bucks ?? [])].map((a) => ({ value: `animal:${a.id}`, label: animalName(a) })),
    ...(litters.data?.litters ?? []).filter((l) => l.status === 'nursing').map((l) => ({ value: `litter:${l.id}`, label: `Litter of ${animalName(l.dam)}` })),
  ];
  const errors = fieldErrors(place.error);
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
                {p.animal ? animalName(p.animal) : p.litter ? `Litter of ${animalName(p.litter.dam)}` : ''} · since {formatDate(p.placedOn)}
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
        <form
          className="flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            const [type, id] = who.split(':');
            if (!id) return;
            place.mutate({ unitId: unit.id, input: { ...(type === 'animal' ? { animalId: id } : { litterId: id }), placedOn: today, note: '' } }, { onSuccess: () => setWho('') });
          }}
        >
          <SelectField label={`Move into ${unit.name}`} value={who} onChange={(e) => setWho(e.target.value)} options={options} className="flex-1" error={errors.animalId ?? errors.litterId ?? errors.placedOn} />
          <Button type="submit" variant="secondary" isBusy={place.isPending}>
            Move in
          </Button>
        </form>
      )}
      {(place.isError || end.isError) && !errors.animalId && !errors.litterId && !errors.placedOn && (
        <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(place.error ?? end.error)}</p>
      )}
    </Card>
  );
}

/** The farm's hutches and pens, each with what is in it now and since when. */
export function HousingBoard({ today, canEdit }: { today: string; canEdit: boolean }) {
  const units = useHousingUnits();
  const create = useCreateHousingUnit();
  const [name, setName] = useState('');
  const [kind, setKind] = useState<HousingKind>('hutch');
  const errors = fieldErrors(create.error);
  return (
    <div className="space-y-6">
      {canEdit && (
        <Card>
          <form
            className="grid items-end gap-4 sm:grid-cols-[1fr_1fr_auto]"
            onSubmit={(e) => {
              e.preventDefault();
              create.mutate({ name, kind, capacity: null, notes: '' }, { onSuccess: () => setName('') });
            }}
          >
            <TextField label="New hutch or pen" value={name} onChange={(e) => setName(e.target.value)} error={errors.name} />
            <SelectField label="Kind" value={kind} onChange={(e) => setKind(e.target.value as HousingKind)} options={Object.entries(kindWords).map(([value, label]) => ({ value, label }))} />
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
