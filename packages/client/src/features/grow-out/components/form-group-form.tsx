import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { ErrorCode, gramsToWeightInput, weightInputToGrams, type WeightUnit } from '@burrowline/shared';
import { useFarmToday } from '../../farms';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { formatDate } from '../../../lib/days';
import { useHousingUnits } from '../../litters';
import { useLitterChoices } from '../api/get-litter-choices';
import { useFormGroup } from '../api/group-mutations';
import { WeightInput } from '../../../components/ui/weight-input';

const fieldError = (error: unknown, field: string) => (isApiError(error) ? error.details[field]?.[0] : undefined);

/** Forms a group from kits of one or more weaned litters (or litters at weaning age). */
export function FormGroupForm({ unit, defaultTargetGrams }: { unit: WeightUnit; defaultTargetGrams: number }) {
  const { data } = useLitterChoices();
  const housing = useHousingUnits();
  const save = useFormGroup();
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [formedOn, setFormedOn] = useState(useFarmToday());
  const initial = gramsToWeightInput(defaultTargetGrams, unit);
  const [targetMajor, setTargetMajor] = useState(initial.major);
  const [targetMinor, setTargetMinor] = useState(initial.minor);
  const [unitId, setUnitId] = useState('');
  const [heads, setHeads] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const targetGrams = weightInputToGrams(targetMajor, targetMinor, unit);
    const litters = data.litters
      .map((l, index) => ({ litterId: l.litterId, heads: Number(heads[l.litterId] || 0), index }))
      .filter((l) => l.heads > 0);
    if (!targetGrams) return setProblem('Enter the target weight');
    if (litters.length === 0) return setProblem('Put kits of at least one litter in the group');
    setProblem(null);
    save.mutate(
      { name, formedOn, targetGrams, housingUnitId: unitId || null, litters: litters.map(({ litterId, heads: n }) => ({ litterId, heads: n })) },
      { onSuccess: (group) => void navigate(`/grow-out/groups/${group.id}`) },
    );
  };
  // Server messages are keyed by the position among the litters sent.
  const sent = data.litters.filter((l) => Number(heads[l.litterId] || 0) > 0).map((l) => l.litterId);
  const litterError = (litterId: string) => {
    const i = sent.indexOf(litterId);
    return i < 0 ? undefined : fieldError(save.error, `litters.${i}.heads`) ?? fieldError(save.error, `litters.${i}.litterId`);
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-5" aria-label="Form a group">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Group name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError(save.error, 'name')} />
        <TextField label="Formed on" type="date" value={formedOn} onChange={(e) => setFormedOn(e.target.value)} error={fieldError(save.error, 'formedOn')} />
        <WeightInput
          label="Target weight" unit={unit} major={targetMajor} minor={targetMinor} onMajor={setTargetMajor} onMinor={setTargetMinor}
          error={fieldError(save.error, 'targetGrams')}
          hint="Live weight per head. About 5 lb (2,270 g) is the usual fryer at 8–10 weeks (common practice)."
        />
        <SelectField
          label="Pen"
          value={unitId}
          onChange={(e) => setUnitId(e.target.value)}
          options={[{ value: '', label: 'No pen' }, ...(housing.data?.units ?? []).map((u) => ({ value: u.id, label: u.name }))]}
          error={fieldError(save.error, 'housingUnitId')}
          hint="Feed given to a pen is shared by the groups in it"
        />
      </div>
      <fieldset className="space-y-3">
        <legend className="font-semibold">Kits from each litter</legend>
        {data.litters.length === 0 ? (
          <p className="text-grey-600">No litter has kits at weaning age that are not in a group already.</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {data.litters.map((l) => (
              <li key={l.litterId} className="rounded-xl border border-grey-200 p-3">
                <TextField
                  label={`Kits from ${l.dam.name}'s litter`}
                  inputMode="numeric"
                  value={heads[l.litterId] ?? ''}
                  onChange={(e) => setHeads({ ...heads, [l.litterId]: e.target.value })}
                  hint={`Kindled ${formatDate(l.kindledOn)} (${l.ageDays} days) by ${l.sire.name} · ${l.crossLabel} · ${l.available} of ${l.alive} alive free${l.weaned ? ' · weaned' : ''}`}
                  error={litterError(l.litterId)}
                />
              </li>
            ))}
          </ul>
        )}
        {fieldError(save.error, 'litters') && <p className="text-clay-deep">{fieldError(save.error, 'litters')}</p>}
      </fieldset>
      {problem && <Alert tone="error">{problem}</Alert>}
      {save.isError && !isApiError(save.error, ErrorCode.validation) && <Alert tone="error">{save.error.message}</Alert>}
      <Button type="submit" isBusy={save.isPending}>
        Form group
      </Button>
    </form>
  );
}
