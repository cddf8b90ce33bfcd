import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import {
  ErrorCode, feedPurchaseCreateSchema, feedUseCreateSchema, gramsToWeightInput, weightInputToGrams,
  type FeedAllocationRule, type FeedOverviewDto, type FeedPurchaseCreateBody, type FeedPurchaseDto, type FeedTarget, type FeedUseCreateBody,
  type FeedUseDto, type WeightUnit,
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
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber, typedOptionalNumber } from '../../../lib/typed-number';
import { useServerSubmit, type ServerMutateOptions } from '../../../lib/use-server-submit';
import { useCorrectFeedUse, useCorrectPurchase, useRecordFeedUse, useRecordPurchase } from '../api/record-feed';

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

interface PurchaseValues {
  boughtOn: string;
  productName: string;
  bagMajor: string;
  bagMinor: string;
  bags: string;
  price: string;
  protein: string;
}

const purchaseFields = { boughtOn: 'boughtOn', productName: 'productName', bagGrams: 'bagMajor', bags: 'bags', priceCents: 'price', crudeProteinPercent: 'protein' } as const;
const purchaseFieldOf = (path: string) => purchaseFields[path as keyof typeof purchaseFields] ?? null;

/** Feed bought: the bag weight in the farm's units, stored in grams; the price in cents. */
export function PurchaseForm({ unit, editing, onDone }: { unit: WeightUnit } & CorrectionProps<FeedPurchaseDto>) {
  const record = useRecordPurchase();
  const correct = useCorrectPurchase();
  const save = editing ? correct : record;
  const bagStart = editing ? gramsToWeightInput(editing.bagGrams, unit) : { major: unit === 'lb_oz' ? '50' : '25', minor: '' };
  const today = useFarmToday();
  const form = useForm<PurchaseValues, unknown, FeedPurchaseCreateBody>({
    resolver: sharedSchemaResolver(
      feedPurchaseCreateSchema,
      (v) => ({
        boughtOn: v.boughtOn,
        productName: v.productName,
        bagGrams: weightInputToGrams(v.bagMajor, v.bagMinor, unit) ?? NaN,
        bags: typedNumber(v.bags),
        priceCents: Math.round(typedNumber(v.price.replace(',', '.')) * 100),
        crudeProteinPercent: typedOptionalNumber(v.protein),
        note: editing?.note ?? '',
      }),
      purchaseFieldOf,
    ),
    defaultValues: {
      boughtOn: editing?.boughtOn ?? today,
      productName: editing?.productName ?? '',
      bagMajor: bagStart.major,
      bagMinor: bagStart.minor,
      bags: String(editing?.bags ?? 1),
      price: editing?.priceCents != null ? (editing.priceCents / 100).toFixed(2) : '',
      protein: editing?.crudeProteinPercent != null ? String(editing.crudeProteinPercent) : '',
    },
  });
  const { errors } = form.formState;
  // A correction sends the whole purchase again with the version it was read at.
  const send = {
    mutate: (body: FeedPurchaseCreateBody, options?: ServerMutateOptions<FeedOverviewDto>) =>
      editing ? correct.mutate({ id: editing.id, body: { ...body, version: editing.version } }, options) : record.mutate(body, options),
    reset: save.reset,
    error: save.error,
  };
  const { submit } = useServerSubmit(form, send, {
    fields: purchaseFieldOf,
    onSuccess: () => (editing ? onDone?.(true) : form.reset({ ...form.getValues(), price: '', productName: '' })),
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={editing ? 'Correct a feed purchase' : 'Record a feed purchase'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Bought on" type="date" error={errors.boughtOn?.message} {...form.register('boughtOn')} />
        <TextField label="Feed" error={errors.productName?.message} hint="The product or mix, e.g. Grower pellets 16 %" {...form.register('productName')} />
        <WeightInput label="Bag weight" unit={unit} error={errors.bagMajor?.message} majorProps={form.register('bagMajor')} minorProps={form.register('bagMinor')} />
        <TextField label="Bags" inputMode="numeric" error={errors.bags?.message} {...form.register('bags')} />
        <TextField label="Price paid" inputMode="decimal" error={errors.price?.message} hint="For all the bags together" {...form.register('price')} />
        <TextField label="Crude protein (%)" inputMode="decimal" error={errors.protein?.message}
          hint="From the tag. Growing rabbits need about 16 %, does in milk 17 % (NRC 1977)." {...form.register('protein')} />
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

interface FeedUseValues {
  givenOn: string;
  fromOn: string;
  /** The amount in the farm's units. */
  major: string;
  minor: string;
  /** A purchase's id, or "product:<name>" for the oldest stock of that feed. */
  source: string;
  target: FeedTarget;
  groupId: string;
  housingUnitId: string;
  doeId: string;
  allocation: FeedAllocationRule;
}

const feedUseFields = {
  givenOn: 'givenOn', fromOn: 'fromOn', grams: 'major', purchaseId: 'source', productName: 'source', target: 'target',
  groupId: 'groupId', housingUnitId: 'housingUnitId', doeId: 'doeId', allocation: 'allocation',
} as const;
const feedUseFieldOf = (path: string) => feedUseFields[path as keyof typeof feedUseFields] ?? null;

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
  const inStock = book.products.filter((p) => p.gramsLeft > 0);
  const growing = (groups.data?.groups ?? []).map((g) => ({ value: g.id, label: g.name }));
  // A correction may be for a group closed since: keep it choosable.
  const groupOptions = editing?.groupId && !growing.some((g) => g.value === editing.groupId) ? [{ value: editing.groupId, label: editing.targetLabel }, ...growing] : growing;
  const unitOptions = (housing.data?.units ?? []).map((u) => ({ value: u.id, label: u.name }));
  const doeOptions = (stock.data?.does ?? []).map((d) => ({ value: d.id, label: d.tattoo ? `${d.name} (${d.tattoo})` : d.name }));
  const form = useForm<FeedUseValues, unknown, FeedUseCreateBody>({
    resolver: sharedSchemaResolver(
      feedUseCreateSchema,
      (v) => {
        // "product:<name>" is the oldest stock of a feed; anything else is one purchase.
        const feed = v.source.startsWith('product:') ? { productName: v.source.slice('product:'.length) } : { purchaseId: v.source || undefined };
        return {
          givenOn: v.givenOn, ...(v.fromOn ? { fromOn: v.fromOn } : {}), grams: weightInputToGrams(v.major, v.minor, unit) ?? NaN, ...feed, target: v.target, note: editing?.note ?? '',
          // A select shows its first option until touched: that option is the choice.
          ...(v.target === 'group' ? { groupId: v.groupId || groupOptions[0]?.value } : {}),
          ...(v.target === 'pen' ? { housingUnitId: v.housingUnitId || unitOptions[0]?.value } : {}),
          ...(v.target === 'doe' ? { doeId: v.doeId || doeOptions[0]?.value } : {}),
          ...(v.target === 'pen' || v.target === 'farm' ? { allocation: v.allocation } : {}),
        };
      },
      feedUseFieldOf,
    ),
    defaultValues: {
      givenOn: editing?.givenOn ?? today,
      fromOn: editing && editing.fromOn !== editing.givenOn ? editing.fromOn : '',
      major: amountStart.major,
      minor: amountStart.minor,
      source: editing ? editing.purchaseId ?? `product:${editing.productName}` : inStock[0] ? `product:${inStock[0].name}` : '',
      target: editing?.target ?? 'group',
      groupId: editing?.groupId ?? '',
      housingUnitId: editing?.housingUnitId ?? '',
      doeId: editing?.doeId ?? '',
      allocation: editing?.allocation ?? 'head_days',
    },
  });
  const { errors } = form.formState;
  const target = form.watch('target');
  const send = {
    mutate: (body: FeedUseCreateBody, options?: ServerMutateOptions<FeedOverviewDto>) =>
      editing ? correct.mutate({ id: editing.id, body: { ...body, version: editing.version } }, options) : record.mutate(body, options),
    reset: save.reset,
    error: save.error,
  };
  const { submit } = useServerSubmit(form, send, {
    fields: feedUseFieldOf,
    onSuccess: () => (editing ? onDone?.(true) : form.reset({ ...form.getValues(), major: '', minor: '' })),
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={editing ? 'Correct feed given' : 'Record feed given'}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Given on" type="date" error={errors.givenOn?.message} {...form.register('givenOn')} />
        <TextField label="Period from" type="date" error={errors.fromOn?.message}
          hint="When the amount covers several days (leave empty for one day)" {...form.register('fromOn')} />
        <WeightInput label="Amount" unit={unit} error={errors.major?.message} majorProps={form.register('major')} minorProps={form.register('minor')} />
        <SelectField
          label="Feed from"
          error={errors.source?.message}
          hint="Cost is worked first bought, first used across purchases of the same feed"
          options={[
            ...book.products.map((p) => ({ value: `product:${p.name}`, label: `${p.name}: oldest stock first (${weight(p.gramsLeft, unit)} left)` })),
            ...book.purchases.filter((p) => p.gramsLeft > 0 || p.id === editing?.purchaseId).map((p) => ({ value: p.id, label: `${p.productName} bought ${formatDate(p.boughtOn)} (${weight(p.gramsLeft, unit)} left)` })),
          ]}
          {...form.register('source')}
        />
        <SelectField label="Feed given to" options={targetOptions} error={errors.target?.message} {...form.register('target')} />
        {target === 'group' && <SelectField label="Group" options={groupOptions} error={errors.groupId?.message} {...form.register('groupId')} />}
        {target === 'pen' && <SelectField label="Pen" options={unitOptions} error={errors.housingUnitId?.message} {...form.register('housingUnitId')} />}
        {target === 'doe' && <SelectField label="Doe" options={doeOptions} error={errors.doeId?.message} {...form.register('doeId')} />}
        {(target === 'pen' || target === 'farm') && (
          <SelectField
            label="Split by"
            error={errors.allocation?.message}
            hint="Over the groups and the does with litters there in the period"
            options={[{ value: 'head_days', label: 'Head-days (heads × days present)' }, { value: 'live_weight', label: 'Live weight' }]}
            {...form.register('allocation')}
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
