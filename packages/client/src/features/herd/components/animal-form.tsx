import { useRef } from 'react';
import { useForm, type Path } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { animalCreateSchema, animalUpdateSchema, kitBirthDateProblem, type AnimalCreateBody, type AnimalDetailDto, type AnimalUpdateBody, type BreedDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LinkButton } from '../../../components/ui/link-button';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { ConfirmWarnings } from '../../../components/ui/confirm-warnings';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useSaveAnimal } from '../api/save-animal';
import { ParentPicker, type ParentChoice } from './parent-picker';
import { useFarmToday } from '../../farms';
import { useQuery } from '@tanstack/react-query';
import { housingUnitsQueryOptions, useDamKindlingDays } from '../../litters';
import { formatDate } from '../../../lib/days';
import { animalName } from '../../../lib/names';

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

interface AnimalValues extends Fields {
  sire: ParentChoice;
  dam: ParentChoice;
}

type AnimalBody = AnimalCreateBody | AnimalUpdateBody;

/** A parent's messages ("sireId", "sireFromPapers.name") show under that parent's picker. */
const fieldOf = (path: string): Path<AnimalValues> | null => {
  if (path.startsWith('sire')) return 'sire';
  if (path.startsWith('dam')) return 'dam';
  return (Object.keys(initialFields(null, '')) as (keyof Fields)[]).find((f) => f === path.split('.')[0]) ?? null;
};

/**
 * Add or edit an animal. The server checks everything (tattoo already kept, buck as dam, parent born
 * after the child, a cycle, an unknown breed) and answers field by field; a young parent comes back
 * as a warning to confirm.
 */
export function AnimalForm({ animal, breeds }: { animal: AnimalDetailDto | null; breeds: BreedDto[] }) {
  const navigate = useNavigate();
  const save = useSaveAnimal(animal?.id ?? null);
  const today = useFarmToday();
  // The chosen dam's kindling days, read by the resolver: a kit is born on one of them (the server's rule).
  const damKindlings = useRef<{ damId: string; label: string; days: string[] } | null>(null);
  // The hutch is one of the farm's hutches (a new name makes one): the same list the Hutches screen keeps.
  const units = useQuery(housingUnitsQueryOptions());
  const hutchNames = (units.data?.units ?? []).filter((u) => u.kind === 'hutch' || u.kind === 'pen').map((u) => u.name);
  const form = useForm<AnimalValues, unknown, AnimalBody>({
    resolver: sharedSchemaResolver(
      animal ? animalUpdateSchema : animalCreateSchema,
      (fields, refuse) => {
        // A parent searched for but not picked yet: nothing to save until one is chosen.
        if (fields.sire.mode === 'animal' && !fields.sire.card) refuse('sire', 'Choose the sire, or say it is unknown');
        if (fields.dam.mode === 'animal' && !fields.dam.card) refuse('dam', 'Choose the dam, or say it is unknown');
        const kindlings = damKindlings.current;
        const damChanged = fields.dam.mode === 'animal' && fields.dam.card?.id !== animal?.dam?.id;
        if (kindlings && fields.dam.mode === 'animal' && fields.dam.card?.id === kindlings.damId && fields.birthDate && (damChanged || fields.birthDate !== animal?.birthDate)) {
          const problem = kitBirthDateProblem(fields.birthDate, { label: kindlings.label, kindledOn: kindlings.days });
          if (problem) refuse('birthDate', problem);
        }
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
          ...parentBody('sire', fields.sire),
          ...parentBody('dam', fields.dam),
        };
        if (animal) return { ...common, version: animal.version };
        return {
          ...common,
          origin: fields.origin,
          ...(fields.origin === 'arrived' ? { arrivedOn: fields.arrivedOn, breederName: fields.breederName } : {}),
        };
      },
      fieldOf,
    ),
    defaultValues: { ...initialFields(animal, today), sire: initialParent(animal?.sire), dam: initialParent(animal?.dam) },
  });
  const { errors } = form.formState;
  const { submit, confirm, warnings, failure } = useServerSubmit(form, save, {
    fields: fieldOf,
    onSuccess: (saved) => navigate(`/herd/${saved.id}`, { state: { saved: true } }),
  });
  const err = (key: keyof Fields) => errors[key]?.message;
  const parentErrors = (role: 'sire' | 'dam'): Record<string, string[]> => {
    const message = errors[role]?.message;
    return message ? { [`${role}Id`]: [message] } : {};
  };
  const [sex, origin, sire, dam, birthDate] = form.watch(['sex', 'origin', 'sire', 'dam', 'birthDate']);
  const damCard = dam.mode === 'animal' ? dam.card : null;
  const kindlingDays = useDamKindlingDays(damCard?.id ?? null);
  damKindlings.current = damCard ? { damId: damCard.id, label: animalName(damCard), days: kindlingDays } : null;
  const hasFieldErrors = Object.keys(errors).some((key) => key !== 'root');

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      <ConfirmWarnings warnings={warnings} onConfirm={confirm} isBusy={save.isPending} title="Please check before saving" />
      {failure && <Alert tone="error">{failure}</Alert>}
      {hasFieldErrors && <Alert tone="error" title="Not saved">Some fields need attention; nothing was saved.</Alert>}

      <div className="grid gap-5 md:grid-cols-2">
        <TextField label="Ear tattoo" error={err('tattoo')} autoComplete="off" {...form.register('tattoo')} />
        <TextField label="Name" error={err('name')} hint="Optional for fryers and kits." {...form.register('name')} />
        <div className="space-y-1.5">
          <p className="font-medium" id="sex-label">
            Sex
          </p>
          <SegmentedFilter label="Sex" value={sex} onChange={(v) => form.setValue('sex', v)} options={[{ value: 'doe', label: 'Doe' }, { value: 'buck', label: 'Buck' }]} />
          {err('sex') && <p className="text-sm font-medium text-clay-deep">{err('sex')}</p>}
        </div>
        <TextField label="Birth date" type="date" error={err('birthDate')} {...form.register('birthDate')} />
        <SelectField
          label="Declared breed"
          hint="With parents recorded, the breed make-up comes from them; without, this is its breed (or unknown)."
          options={[{ value: '', label: 'Unknown / from its parents' }, ...breeds.map((b) => ({ value: b.id, label: b.name }))]}
          error={err('breedId')}
          {...form.register('breedId')}
        />
        <TextField label="Colour or variety" error={err('colour')} {...form.register('colour')} />
        <TextField label="Registration number" error={err('registrationNumber')} {...form.register('registrationNumber')} />
        <TextField
          label="Hutch"
          list="farm-hutches"
          autoComplete="off"
          hint={hutchNames.length > 0 ? 'One of the farm’s hutches; a new name adds a hutch on the Hutches screen.' : 'A new name adds a hutch on the Hutches screen.'}
          error={err('hutch')}
          {...form.register('hutch')}
        />
        <datalist id="farm-hutches">
          {hutchNames.map((name) => <option key={name} value={name} />)}
        </datalist>
      </div>

      {!animal && (
        <div className="space-y-3">
          <SegmentedFilter
            label="Where it comes from"
            value={origin}
            onChange={(v) => form.setValue('origin', v)}
            options={[{ value: 'born_here', label: 'Born on this farm' }, { value: 'arrived', label: 'Arrived from outside' }]}
          />
          {origin === 'arrived' && (
            <div className="grid gap-5 md:grid-cols-2">
              <TextField label="Arrived on" type="date" error={err('arrivedOn')} {...form.register('arrivedOn')} />
              <TextField label="Bred by" error={err('breederName')} {...form.register('breederName')} />
              <Alert tone="warning" className="md:col-span-2">
                Keep new arrivals apart from the herd for the co-op's quarantine period (30 days is a common recommendation for RHDV2).
              </Alert>
            </div>
          )}
        </div>
      )}

      <div className="grid gap-5 lg:grid-cols-2">
        <ParentPicker role="sire" value={sire} onChange={(choice) => form.setValue('sire', choice)} breeds={breeds} errors={parentErrors('sire')} />
        <div className="space-y-3">
          <ParentPicker role="dam" value={dam} onChange={(choice) => form.setValue('dam', choice)} breeds={breeds} errors={parentErrors('dam')} />
          {damCard && kindlingDays.length > 0 && (
            <div className="space-y-2 rounded-xl bg-oat p-3" role="group" aria-label={`${animalName(damCard)}'s litters`}>
              <p className="text-sm text-bark">A kit of hers is born on her litter's kindling day. Her litters on your record:</p>
              <div className="flex flex-wrap gap-2">
                {kindlingDays.slice(-6).reverse().map((day) => (
                  <Button
                    key={day}
                    type="button"
                    variant={birthDate === day ? 'primary' : 'secondary'}
                    aria-pressed={birthDate === day}
                    onClick={() => form.setValue('birthDate', day, { shouldValidate: form.formState.isSubmitted })}
                  >
                    Born {formatDate(day)}
                  </Button>
                ))}
              </div>
            </div>
          )}
        </div>
      </div>

      <TextAreaField label="Notes" error={err('notes')} {...form.register('notes')} />

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
