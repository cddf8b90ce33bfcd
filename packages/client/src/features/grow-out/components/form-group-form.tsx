import { useForm, type Path } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { countOf, gramsToWeightInput, growOutGroupCreateSchema, weightInputToGrams, type GrowOutGroupCreateBody, type WeightUnit } from '@burrowline/shared';
import { useFarmToday } from '../../farms';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber } from '../../../lib/typed-number';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { formatDate } from '../../../lib/days';
import { useHousingUnits } from '../../litters';
import { useLitterChoices } from '../api/get-litter-choices';
import { useFormGroup } from '../api/group-mutations';
import { WeightInput } from '../../../components/ui/weight-input';

interface FormGroupValues {
  name: string;
  formedOn: string;
  targetMajor: string;
  targetMinor: string;
  housingUnitId: string;
  /** Kits typed for each litter offered, in the order offered; an empty box takes none. */
  heads: { count: string }[];
}

/** Forms a group from kits of one or more weaned litters (or litters at weaning age). */
export function FormGroupForm({ unit, defaultTargetGrams }: { unit: WeightUnit; defaultTargetGrams: number }) {
  const { data } = useLitterChoices();
  const housing = useHousingUnits();
  const save = useFormGroup();
  const navigate = useNavigate();
  const today = useFarmToday();
  const initial = gramsToWeightInput(defaultTargetGrams, unit);
  // The body lists only litters with kits; its "litters.<i>" is the i-th of those, mapped back to its box.
  const sentIndexes = (heads: { count: string }[]) => heads.flatMap((h, index) => (typedNumber(h.count || '0') > 0 ? [index] : []));
  const fieldOf = (path: string): Path<FormGroupValues> | null => {
    const litter = /^litters\.(\d+)\./.exec(path);
    if (litter) {
      const index = sentIndexes(form.getValues('heads'))[Number(litter[1])];
      return index === undefined ? null : `heads.${index}.count`;
    }
    // "Pick at least one litter" belongs to no one box: it shows under the list.
    return ({ name: 'name', formedOn: 'formedOn', targetGrams: 'targetMajor', housingUnitId: 'housingUnitId' } as const)[path as 'name'] ?? null;
  };
  const form = useForm<FormGroupValues, unknown, GrowOutGroupCreateBody>({
    resolver: sharedSchemaResolver(
      growOutGroupCreateSchema,
      (v) => ({
        name: v.name,
        formedOn: v.formedOn,
        targetGrams: weightInputToGrams(v.targetMajor, v.targetMinor, unit) ?? NaN,
        housingUnitId: v.housingUnitId || null,
        litters: sentIndexes(v.heads).map((index) => ({ litterId: data.litters[index]!.litterId, heads: typedNumber(v.heads[index]!.count) })),
      }),
      (path) => fieldOf(path),
    ),
    defaultValues: {
      name: '',
      formedOn: today,
      targetMajor: initial.major,
      targetMinor: initial.minor,
      housingUnitId: '',
      heads: data.litters.map(() => ({ count: '' })),
    },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, { fields: fieldOf, onSuccess: (group) => void navigate(`/grow-out/groups/${group.id}`) });

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label="Form a group">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Group name" error={errors.name?.message} {...form.register('name')} />
        <TextField label="Formed on" type="date" error={errors.formedOn?.message} {...form.register('formedOn')} />
        <WeightInput
          label="Target weight" unit={unit} majorProps={form.register('targetMajor')} minorProps={form.register('targetMinor')}
          error={errors.targetMajor?.message}
          hint="Live weight per head. About 5 lb (2,270 g) is the usual fryer at 8–10 weeks (common practice)."
        />
        <SelectField
          label="Pen"
          options={[{ value: '', label: 'No pen' }, ...(housing.data?.units ?? []).map((u) => ({ value: u.id, label: u.name }))]}
          error={errors.housingUnitId?.message}
          hint="Feed given to a pen is shared by the groups in it"
          {...form.register('housingUnitId')}
        />
      </div>
      <fieldset className="space-y-3">
        <legend className="font-semibold">Kits from each litter</legend>
        {data.litters.length === 0 ? (
          <p className="text-grey-600">No litter has kits at weaning age that are not in a group already.</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {data.litters.map((l, index) => (
              <li key={l.litterId} className="rounded-xl border border-grey-200 p-3">
                <TextField
                  label={`Kits from ${l.dam.name}'s litter`}
                  inputMode="numeric"
                  hint={`Kindled ${formatDate(l.kindledOn)} (${countOf(l.ageDays, 'day')}) by ${l.sire.name} · ${l.crossLabel} · ${l.available} of ${l.alive} alive free${l.weaned ? ' · weaned' : ''}`}
                  error={errors.heads?.[index]?.count?.message}
                  {...form.register(`heads.${index}.count`)}
                />
              </li>
            ))}
          </ul>
        )}
        {errors.root?.message && <p className="text-clay-deep">{errors.root.message}</p>}
      </fieldset>
      {failure && failure !== errors.root?.message && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={save.isPending}>
        Form group
      </Button>
    </form>
  );
}
