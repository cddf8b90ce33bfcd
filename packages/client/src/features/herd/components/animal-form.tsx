import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorCode, type AnimalCreateBody, type AnimalDetailDto, type AnimalUpdateBody, type BreedDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LinkButton } from '../../../components/ui/link-button';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { useSaveAnimal } from '../api/save-animal';
import { ParentPicker, type ParentChoice } from './parent-picker';
import { useFarmToday } from '../../farms';

interface Fields {
  tattoo: string;
  name: string;
  sex: 'buck' | 'doe';
  breedId: string;
  colour: string;
  birthDate: string;
  origin: 'born_here' | 'arrived';
  arrivedOn: string;
  breederName: string;
  registrationNumber: string;
  hutch: string;
  notes: string;
}

function initialFields(animal: AnimalDetailDto | null, today: string): Fields {
  return {
    tattoo: animal?.tattoo ?? '',
    name: animal?.name ?? '',
    sex: animal?.sex ?? 'doe',
    breedId: animal?.breedId ?? '',
    colour: animal?.colour ?? '',
    birthDate: animal?.birthDate ?? '',
    origin: 'born_here',
    arrivedOn: today,
    breederName: '',
    registrationNumber: animal?.registrationNumber ?? '',
    hutch: animal?.hutch ?? '',
    notes: animal?.notes ?? '',
  };
}

function initialParent(card: AnimalDetailDto['sire'] | undefined): ParentChoice {
  return card ? { mode: 'animal', card } : { mode: 'unknown' };
}

function parentBody(role: 'sire' | 'dam', choice: ParentChoice) {
  if (choice.mode === 'animal') return { [`${role}Id`]: choice.card?.id ?? null };
  if (choice.mode === 'papers') {
    const p = choice.papers;
    return { [`${role}FromPapers`]: { name: p.name, tattoo: p.tattoo || null, registrationNumber: p.registrationNumber || null, breedId: p.breedId || null } };
  }
  return { [`${role}Id`]: null };
}

/**
 * Add or edit an animal. The server checks everything (tattoo already kept, buck as dam, parent born
 * after the child, a cycle, an unknown breed) and answers field by field; a young parent comes back
 * as a warning to confirm.
 */
export function AnimalForm({ animal, breeds }: { animal: AnimalDetailDto | null; breeds: BreedDto[] }) {
  const navigate = useNavigate();
  const save = useSaveAnimal(animal?.id ?? null);
  const today = useFarmToday();
  const [fields, setFields] = useState<Fields>(() => initialFields(animal, today));
  const [sire, setSire] = useState<ParentChoice>(() => initialParent(animal?.sire));
  const [dam, setDam] = useState<ParentChoice>(() => initialParent(animal?.dam));
  const set = <K extends keyof Fields>(key: K, value: Fields[K]) => setFields((f) => ({ ...f, [key]: value }));
  const errors = isApiError(save.error) && save.error.code === ErrorCode.validation ? save.error.details : {};
  const warnings = isApiError(save.error, ErrorCode.confirmationRequired) ? save.error.details : null;
  const err = (key: string) => errors[key]?.[0];

  const body = (confirm: boolean): AnimalCreateBody | AnimalUpdateBody => {
    const common = {
      tattoo: fields.tattoo,
      name: fields.name,
      sex: fields.sex,
      breedId: fields.breedId || null,
      colour: fields.colour,
      birthDate: fields.birthDate,
      registrationNumber: fields.registrationNumber || null,
      hutch: fields.hutch,
      notes: fields.notes,
      ...parentBody('sire', sire),
      ...parentBody('dam', dam),
      ...(confirm ? { confirm: true } : {}),
    };
    if (animal) return { ...common, version: animal.version };
    return {
      ...common,
      origin: fields.origin,
      ...(fields.origin === 'arrived' ? { arrivedOn: fields.arrivedOn, breederName: fields.breederName } : {}),
    };
  };

  const submit = (confirm: boolean) => {
    if ((sire.mode === 'animal' && !sire.card) || (dam.mode === 'animal' && !dam.card)) return;
    save.mutate(body(confirm), { onSuccess: (saved) => navigate(`/herd/${saved.id}`, { state: { saved: true } }) });
  };
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    submit(false);
  };

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      {warnings && (
        <Alert
          tone="warning"
          title="Please check before saving"
          actions={
            <Button onClick={() => submit(true)} isBusy={save.isPending}>
              Save anyway
            </Button>
          }
        >
          <ul className="list-disc space-y-1 pl-5">
            {Object.values(warnings).flat().map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </Alert>
      )}
      {save.isError && !warnings && Object.keys(errors).length === 0 && <Alert tone="error">{save.error.message}</Alert>}
      {Object.keys(errors).length > 0 && <Alert tone="error" title="Not saved">Some fields need attention; nothing was saved.</Alert>}

      <div className="grid gap-5 md:grid-cols-2">
        <TextField label="Ear tattoo" value={fields.tattoo} onChange={(e) => set('tattoo', e.target.value)} error={err('tattoo')} autoComplete="off" />
        <TextField label="Name" value={fields.name} onChange={(e) => set('name', e.target.value)} error={err('name')} hint="Optional for fryers and kits." />
        <div className="space-y-1.5">
          <p className="font-medium" id="sex-label">
            Sex
          </p>
          <SegmentedFilter label="Sex" value={fields.sex} onChange={(v) => set('sex', v)} options={[{ value: 'doe', label: 'Doe' }, { value: 'buck', label: 'Buck' }]} />
          {err('sex') && <p className="text-sm font-medium text-clay-deep">{err('sex')}</p>}
        </div>
        <TextField label="Birth date" type="date" value={fields.birthDate} onChange={(e) => set('birthDate', e.target.value)} error={err('birthDate')} />
        <SelectField
          label="Declared breed"
          hint="With parents recorded, the breed make-up comes from them; without, this is its breed (or unknown)."
          value={fields.breedId}
          onChange={(e) => set('breedId', e.target.value)}
          options={[{ value: '', label: 'Unknown / from its parents' }, ...breeds.map((b) => ({ value: b.id, label: b.name }))]}
          error={err('breedId')}
        />
        <TextField label="Colour or variety" value={fields.colour} onChange={(e) => set('colour', e.target.value)} error={err('colour')} />
        <TextField label="Registration number" value={fields.registrationNumber} onChange={(e) => set('registrationNumber', e.target.value)} error={err('registrationNumber')} />
        <TextField label="Hutch" value={fields.hutch} onChange={(e) => set('hutch', e.target.value)} error={err('hutch')} />
      </div>

      {!animal && (
        <div className="space-y-3">
          <SegmentedFilter
            label="Where it comes from"
            value={fields.origin}
            onChange={(v) => set('origin', v)}
            options={[{ value: 'born_here', label: 'Born on this farm' }, { value: 'arrived', label: 'Arrived from outside' }]}
          />
          {fields.origin === 'arrived' && (
            <div className="grid gap-5 md:grid-cols-2">
              <TextField label="Arrived on" type="date" value={fields.arrivedOn} onChange={(e) => set('arrivedOn', e.target.value)} error={err('arrivedOn')} />
              <TextField label="Bred by" value={fields.breederName} onChange={(e) => set('breederName', e.target.value)} error={err('breederName')} />
              <Alert tone="warning" className="md:col-span-2">
                Keep new arrivals apart from the herd for the co-op's quarantine period (30 days is a common recommendation for RHDV2).
              </Alert>
            </div>
          )}
        </div>
      )}

      <div className="grid gap-5 lg:grid-cols-2">
        <ParentPicker role="sire" value={sire} onChange={setSire} breeds={breeds} errors={errors} />
        <ParentPicker role="dam" value={dam} onChange={setDam} breeds={breeds} errors={errors} />
      </div>

      <TextAreaField label="Notes" value={fields.notes} onChange={(e) => set('notes', e.target.value)} error={err('notes')} />

      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <LinkButton to={animal ? `/herd/${animal.id}` : '/herd'} variant="secondary">
          Cancel
        </LinkButton>
        <Button type="submit" isBusy={save.isPending && !warnings}>
          {animal ? 'Save changes' : 'Add to herd'}
        </Button>
      </div>
    </form>
  );
}
