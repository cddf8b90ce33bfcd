import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import {
  ErrorCode, gramsToWeightInput, weightInputToGrams,
  type FeedAllocationRule, type FeedOverviewDto, type FeedPurchaseDto, type FeedTarget, type FeedUseDto, type WeightUnit,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { formatDate } from '../../../lib/days';
import { useFarmToday } from '../../farms';
import { breedingStockQueryOptions } from '../../almanac';
import { groupsQueryOptions } from '../../grow-out';
import { WeightInput } from '../../../components/ui/weight-input';
import { weight } from '../../../lib/weights';
import { housingUnitsQueryOptions } from '../../litters';
import { useCorrectFeedUse, useCorrectPurchase, useRecordFeedUse, useRecordPurchase } from '../api/record-feed';

const fieldError = (error: unknown, field: string) => (isApiError(error) ? error.details[field]?.[0] : undefined);

/**
 * A refusal that no field of the form shows: what a change would leave uncovered in the feed book (the
 * server names each feed given, under `listed` fields), a stale version, a lost connection.
 */
export function BookProblems({ error, listed = [] }: { error: unknown; listed?: string[] }) {
  if (!error) return null;
  if (!isApiError(error)) return <Alert tone="error">{error instanceof Error ? error.message : 'That did not save; try again'}</Alert>;
  const problems = [...listed, 'purchase'].flatMap((field) => error.details[field] ?? []);
  if (error.code === ErrorCode.validation && problems.length === 0) return null;
  return (
    <Alert tone="error">
      {error.code === ErrorCode.validation ? 'The feed book would not add up:' : error.message}
      {problems.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {problems.map((p) => <li key={p}>{p}</li>)}
        </ul>
      )}
    </Alert>
  );
}

interface CorrectionProps<T> {
  /** The entry being corrected; without it the form records a new one. */
  editing?: T;
  /** Called with true once the correction is saved, false when it is given up. */
  onDone?: (saved: boolean) => void;
}

/** Feed bought: the bag weight in the farm's units, stored in grams; the price in cents. */
export function PurchaseForm({ unit, editing, onDone }: { unit: WeightUnit } & CorrectionProps<FeedPurchaseDto>) {
  const record = useRecordPurchase();
  const correct = useCorrectPurchase();
  const save = editing ? correct : record;
  const bagStart = editing ? gramsToWeightInput(editing.bagGrams, unit) : { major: unit === 'lb_oz' ? '50' : '25', minor: '' };
  const today = useFarmToday();
  const [on, setOn] = useState(editing?.boughtOn ?? today);
  const [product, setProduct] = useState(editing?.productName ?? '');
  const [bagMajor, setBagMajor] = useState(bagStart.major);
  const [bagMinor, setBagMinor] = useState(bagStart.minor);
  const [bags, setBags] = useState(String(editing?.bags ?? 1));
  const [price, setPrice] = useState(editing?.priceCents != null ? (editing.priceCents / 100).toFixed(2) : '');
  const [protein, setProtein] = useState(editing?.crudeProteinPercent != null ? String(editing.crudeProteinPercent) : '');
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const bagGrams = weightInputToGrams(bagMajor, bagMinor, unit);
    const priceCents = Math.round(Number(price.replace(',', '.')) * 100);
    if (!bagGrams) return setProblem('Enter the bag weight');
    if (price.trim() === '' || !Number.isFinite(priceCents)) return setProblem('Enter what was paid');
    setProblem(null);
    const body = { boughtOn: on, productName: product, bagGrams, bags: Number(bags), priceCents, crudeProteinPercent: protein.trim() === '' ? null : Number(protein), note: editing?.note ?? '' };
    if (editing) correct.mutate({ id: editing.id, body: { ...body, version: editing.version } }, { onSuccess: () => onDone?.(true) });
    else record.mutate(body, { onSuccess: () => { setPrice(''); setProduct(''); } });
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={editing ? 'Correct a feed purchase' : 'Record a feed purchase'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Bought on" type="date" value={on} onChange={(e) => setOn(e.target.value)} error={fieldError(save.error, 'boughtOn')} />
        <TextField label="Feed" value={product} onChange={(e) => setProduct(e.target.value)} error={fieldError(save.error, 'productName')} hint="The product or mix, e.g. Grower pellets 16 %" />
        <WeightInput label="Bag weight" unit={unit} major={bagMajor} minor={bagMinor} onMajor={setBagMajor} onMinor={setBagMinor} error={fieldError(save.error, 'bagGrams')} />
        <TextField label="Bags" inputMode="numeric" value={bags} onChange={(e) => setBags(e.target.value)} error={fieldError(save.error, 'bags')} />
        <TextField label="Price paid" inputMode="decimal" value={price} onChange={(e) => setPrice(e.target.value)} error={problem ?? fieldError(save.error, 'priceCents')} hint="For all the bags together" />
        <TextField label="Crude protein (%)" inputMode="decimal" value={protein} onChange={(e) => setProtein(e.target.value)} error={fieldError(save.error, 'crudeProteinPercent')}
          hint="From the tag. Growing rabbits need about 16 %, does in milk 17 % (NRC 1977)." />
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" isBusy={save.isPending}>
          {editing ? 'Save correction' : 'Save purchase'}
        </Button>
        {editing && <Button variant="secondary" onClick={() => onDone?.(false)}>Cancel</Button>}
      </div>
      {save.isSuccess && <Alert tone="success">Purchase saved.</Alert>}
      <BookProblems error={save.error} listed={['grams']} />
    </form>
  );
}

const targetOptions: { value: FeedTarget; label: string }[] = [
  { value: 'group', label: 'A grow-out group' },
  { value: 'pen', label: 'A pen or hutch' },
  { value: 'doe', label: 'A doe with her litter' },
  { value: 'farm', label: 'The whole farm' },
];

/** Feed given from a purchase (or the oldest stock of a feed) to a group, a pen, a doe and litter or the farm. */
export function FeedUseForm({ book, unit, editing, onDone }: { book: FeedOverviewDto; unit: WeightUnit } & CorrectionProps<FeedUseDto>) {
  const record = useRecordFeedUse();
  const correct = useCorrectFeedUse();
  const save = editing ? correct : record;
  const groups = useQuery(groupsQueryOptions({ status: 'growing' }));
  const housing = useQuery(housingUnitsQueryOptions());
  const stock = useQuery(breedingStockQueryOptions());
  const amountStart = editing ? gramsToWeightInput(editing.grams, unit) : { major: '', minor: '' };
  const today = useFarmToday();
  const [on, setOn] = useState(editing?.givenOn ?? today);
  const [fromOn, setFromOn] = useState(editing && editing.fromOn !== editing.givenOn ? editing.fromOn : '');
  const [major, setMajor] = useState(amountStart.major);
  const [minor, setMinor] = useState(amountStart.minor);
  const inStock = book.products.filter((p) => p.gramsLeft > 0);
  const [source, setSource] = useState(editing ? editing.purchaseId ?? `product:${editing.productName}` : inStock[0] ? `product:${inStock[0].name}` : '');
  const [target, setTarget] = useState<FeedTarget>(editing?.target ?? 'group');
  const [groupId, setGroupId] = useState(editing?.groupId ?? '');
  const [unitId, setUnitId] = useState(editing?.housingUnitId ?? '');
  const [doeId, setDoeId] = useState(editing?.doeId ?? '');
  const [allocation, setAllocation] = useState<FeedAllocationRule>(editing?.allocation ?? 'head_days');
  const [problem, setProblem] = useState<string | null>(null);
  const growing = (groups.data?.groups ?? []).map((g) => ({ value: g.id, label: g.name }));
  // A correction may be for a group closed since: keep it choosable.
  const groupOptions = editing?.groupId && !growing.some((g) => g.value === editing.groupId) ? [{ value: editing.groupId, label: editing.targetLabel }, ...growing] : growing;
  const unitOptions = (housing.data?.units ?? []).map((u) => ({ value: u.id, label: u.name }));
  const doeOptions = (stock.data?.does ?? []).map((d) => ({ value: d.id, label: d.tattoo ? `${d.name} (${d.tattoo})` : d.name }));

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const grams = weightInputToGrams(major, minor, unit);
    if (!grams) return setProblem('Enter the amount');
    setProblem(null);
    const feed = source.startsWith('product:') ? { productName: source.slice('product:'.length) } : { purchaseId: source || undefined };
    const body = {
      givenOn: on, ...(fromOn ? { fromOn } : {}), grams, ...feed, target, note: editing?.note ?? '',
      ...(target === 'group' ? { groupId: groupId || groupOptions[0]?.value } : {}),
      ...(target === 'pen' ? { housingUnitId: unitId || unitOptions[0]?.value } : {}),
      ...(target === 'doe' ? { doeId: doeId || doeOptions[0]?.value } : {}),
      ...(target === 'pen' || target === 'farm' ? { allocation } : {}),
    };
    if (editing) correct.mutate({ id: editing.id, body: { ...body, version: editing.version } }, { onSuccess: () => onDone?.(true) });
    else record.mutate(body, { onSuccess: () => { setMajor(''); setMinor(''); } });
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={editing ? 'Correct feed given' : 'Record feed given'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Given on" type="date" value={on} onChange={(e) => setOn(e.target.value)} error={fieldError(save.error, 'givenOn')} />
        <TextField label="Period from" type="date" value={fromOn} onChange={(e) => setFromOn(e.target.value)} error={fieldError(save.error, 'fromOn')}
          hint="When the amount covers several days (leave empty for one day)" />
        <WeightInput label="Amount" unit={unit} major={major} minor={minor} onMajor={setMajor} onMinor={setMinor} error={problem ?? fieldError(save.error, 'grams')} />
        <SelectField
          label="Feed from"
          value={source}
          onChange={(e) => setSource(e.target.value)}
          error={fieldError(save.error, 'purchaseId') ?? fieldError(save.error, 'productName')}
          hint="Cost is worked first bought, first used across purchases of the same feed"
          options={[
            ...book.products.map((p) => ({ value: `product:${p.name}`, label: `${p.name}: oldest stock first (${weight(p.gramsLeft, unit)} left)` })),
            ...book.purchases.filter((p) => p.gramsLeft > 0 || p.id === editing?.purchaseId).map((p) => ({ value: p.id, label: `${p.productName} bought ${formatDate(p.boughtOn)} (${weight(p.gramsLeft, unit)} left)` })),
          ]}
        />
        <SelectField label="Feed given to" value={target} onChange={(e) => setTarget(e.target.value as FeedTarget)} options={targetOptions} />
        {target === 'group' && <SelectField label="Group" value={groupId} onChange={(e) => setGroupId(e.target.value)} options={groupOptions} error={fieldError(save.error, 'groupId')} />}
        {target === 'pen' && <SelectField label="Pen" value={unitId} onChange={(e) => setUnitId(e.target.value)} options={unitOptions} error={fieldError(save.error, 'housingUnitId')} />}
        {target === 'doe' && <SelectField label="Doe" value={doeId} onChange={(e) => setDoeId(e.target.value)} options={doeOptions} error={fieldError(save.error, 'doeId')} />}
        {(target === 'pen' || target === 'farm') && (
          <SelectField
            label="Split by"
            value={allocation}
            onChange={(e) => setAllocation(e.target.value as FeedAllocationRule)}
            error={fieldError(save.error, 'allocation')}
            hint="Over the groups and the does with litters there in the period"
            options={[{ value: 'head_days', label: 'Head-days (heads × days present)' }, { value: 'live_weight', label: 'Live weight' }]}
          />
        )}
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" isBusy={save.isPending}>
          {editing ? 'Save correction' : 'Save feed given'}
        </Button>
        {editing && <Button variant="secondary" onClick={() => onDone?.(false)}>Cancel</Button>}
      </div>
      {save.isSuccess && <Alert tone="success">Feed given saved.</Alert>}
      <BookProblems error={save.error} />
    </form>
  );
}
