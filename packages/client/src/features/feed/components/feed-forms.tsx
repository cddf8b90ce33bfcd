import { useQuery } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { ErrorCode, todayIn, weightInputToGrams, type FeedAllocationRule, type FeedOverviewDto, type FeedTarget, type WeightUnit } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { formatDate } from '../../almanac/almanac-dates';
import { breedingStockQueryOptions } from '../../almanac/api/get-breeding-stock';
import { groupsQueryOptions } from '../../growout/api/get-groups';
import { WeightInput } from '../../growout/components/weight-input';
import { weight } from '../../growout/growout-format';
import { housingUnitsQueryOptions } from '../../litters/api/housing';
import { useRecordFeedUse, useRecordPurchase } from '../api/record-feed';

const fieldError = (error: unknown, field: string) => (isApiError(error) ? error.details[field]?.[0] : undefined);
const localToday = () => todayIn(Intl.DateTimeFormat().resolvedOptions().timeZone);

/** Feed bought: the bag weight in the farm's units, stored in grams; the price in cents. */
export function PurchaseForm({ unit }: { unit: WeightUnit }) {
  const save = useRecordPurchase();
  const [on, setOn] = useState(localToday);
  const [product, setProduct] = useState('');
  const [bagMajor, setBagMajor] = useState(unit === 'lb_oz' ? '50' : '25');
  const [bagMinor, setBagMinor] = useState('');
  const [bags, setBags] = useState('1');
  const [price, setPrice] = useState('');
  const [protein, setProtein] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const bagGrams = weightInputToGrams(bagMajor, bagMinor, unit);
    const priceCents = Math.round(Number(price.replace(',', '.')) * 100);
    if (!bagGrams) return setProblem('Enter the bag weight');
    if (price.trim() === '' || !Number.isFinite(priceCents)) return setProblem('Enter what was paid');
    setProblem(null);
    save.mutate(
      { boughtOn: on, productName: product, bagGrams, bags: Number(bags), priceCents, crudeProteinPercent: protein.trim() === '' ? null : Number(protein) },
      { onSuccess: () => { setPrice(''); setProduct(''); } },
    );
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Record a feed purchase">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Bought on" type="date" value={on} onChange={(e) => setOn(e.target.value)} error={fieldError(save.error, 'boughtOn')} />
        <TextField label="Feed" value={product} onChange={(e) => setProduct(e.target.value)} error={fieldError(save.error, 'productName')} hint="The product or mix, e.g. Grower pellets 16 %" />
        <WeightInput label="Bag weight" unit={unit} major={bagMajor} minor={bagMinor} onMajor={setBagMajor} onMinor={setBagMinor} error={fieldError(save.error, 'bagGrams')} />
        <TextField label="Bags" inputMode="numeric" value={bags} onChange={(e) => setBags(e.target.value)} error={fieldError(save.error, 'bags')} />
        <TextField label="Price paid" inputMode="decimal" value={price} onChange={(e) => setPrice(e.target.value)} error={problem ?? fieldError(save.error, 'priceCents')} hint="For all the bags together" />
        <TextField label="Crude protein (%)" inputMode="decimal" value={protein} onChange={(e) => setProtein(e.target.value)} error={fieldError(save.error, 'crudeProteinPercent')}
          hint="From the tag. Growing rabbits need about 16 %, does in milk 17 % (NRC 1977)." />
      </div>
      <Button type="submit" isBusy={save.isPending}>
        Save purchase
      </Button>
      {save.isSuccess && <Alert tone="success">Purchase saved.</Alert>}
      {save.isError && !isApiError(save.error, ErrorCode.validation) && <Alert tone="error">{save.error.message}</Alert>}
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
export function FeedUseForm({ book, unit }: { book: FeedOverviewDto; unit: WeightUnit }) {
  const save = useRecordFeedUse();
  const groups = useQuery(groupsQueryOptions({ status: 'growing' }));
  const housing = useQuery(housingUnitsQueryOptions());
  const stock = useQuery(breedingStockQueryOptions());
  const [on, setOn] = useState(localToday);
  const [fromOn, setFromOn] = useState('');
  const [major, setMajor] = useState('');
  const [minor, setMinor] = useState('');
  const inStock = book.products.filter((p) => p.gramsLeft > 0);
  const [source, setSource] = useState(inStock[0] ? `product:${inStock[0].name}` : '');
  const [target, setTarget] = useState<FeedTarget>('group');
  const [groupId, setGroupId] = useState('');
  const [unitId, setUnitId] = useState('');
  const [doeId, setDoeId] = useState('');
  const [allocation, setAllocation] = useState<FeedAllocationRule>('head_days');
  const [problem, setProblem] = useState<string | null>(null);
  const groupOptions = (groups.data?.groups ?? []).map((g) => ({ value: g.id, label: g.name }));
  const unitOptions = (housing.data?.units ?? []).map((u) => ({ value: u.id, label: u.name }));
  const doeOptions = (stock.data?.does ?? []).map((d) => ({ value: d.id, label: d.tattoo ? `${d.name} (${d.tattoo})` : d.name }));

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const grams = weightInputToGrams(major, minor, unit);
    if (!grams) return setProblem('Enter the amount');
    setProblem(null);
    const feed = source.startsWith('product:') ? { productName: source.slice('product:'.length) } : { purchaseId: source || undefined };
    save.mutate(
      {
        givenOn: on, ...(fromOn ? { fromOn } : {}), grams, ...feed, target,
        ...(target === 'group' ? { groupId: groupId || groupOptions[0]?.value } : {}),
        ...(target === 'pen' ? { housingUnitId: unitId || unitOptions[0]?.value } : {}),
        ...(target === 'doe' ? { doeId: doeId || doeOptions[0]?.value } : {}),
        ...(target === 'pen' || target === 'farm' ? { allocation } : {}),
      },
      { onSuccess: () => { setMajor(''); setMinor(''); } },
    );
  };
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Record feed given">
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
            ...book.purchases.filter((p) => p.gramsLeft > 0).map((p) => ({ value: p.id, label: `${p.productName} bought ${formatDate(p.boughtOn)} (${weight(p.gramsLeft, unit)} left)` })),
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
      <Button type="submit" isBusy={save.isPending}>
        Save feed given
      </Button>
      {save.isSuccess && <Alert tone="success">Feed given saved.</Alert>}
      {save.isError && !isApiError(save.error, ErrorCode.validation) && <Alert tone="error">{save.error.message}</Alert>}
    </form>
  );
}
