import { useForm, type Path } from 'react-hook-form';
import {
  countOf,  groupWeighInCreateSchema,
  growOutGroupCloseSchema,
  weightInputToGrams,
  type GroupWeighInCreateBody,
  type GrowOutGroupCloseInput,
  type GrowOutGroupDto,
  type ScheduledWeighInState,
  type WeightUnit,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { SegmentedFilter } from '../../../components/ui/segmented-filter';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { typedNumber } from '../../../lib/typed-number';
import { useServerSubmit, type ServerMutateOptions } from '../../../lib/use-server-submit';
import { formatDate } from '../../../lib/days';
import { useFarmToday } from '../../farms';
import { useCloseGroup, useReviewGroupWeighIn, useWeighGroup } from '../api/group-mutations';
import { gainPerDay, weight } from '../../../lib/weights';
import { useMoney } from '../../../lib/money';
import { WeightInput } from '../../../components/ui/weight-input';

const scheduleWords: Record<ScheduledWeighInState, { word: string; tone: BadgeTone }> = {
  weighed: { word: 'Weighed', tone: 'moss' },
  due: { word: 'Due', tone: 'straw' },
  upcoming: { word: 'Coming', tone: 'neutral' },
  missed: { word: 'Missed', tone: 'clay' },
};

/** The farm's weigh-in ages (set in the Almanac settings) over the group's life, each weighed, due, coming or missed. */
export function WeighInSchedule({ group }: { group: GrowOutGroupDto }) {
  if (group.weighInSchedule.length === 0) return null;
  return (
    <div className="mb-4">
      <h3 className="text-sm font-semibold text-grey-700">The farm&apos;s weigh-in ages</h3>
      <ul className="mt-1 flex flex-wrap gap-2" aria-label="The farm's weigh-in ages">
        {group.weighInSchedule.map((a) => (
          <li key={a.ageDays} className="rounded-lg border border-grey-200 px-2 py-1 text-sm">
            {countOf(a.ageDays, 'day')} · {formatDate(a.on)}{' '}
            <Badge tone={scheduleWords[a.state].tone}>
              {scheduleWords[a.state].word}
              {a.weighedOn && a.weighedOn !== a.on ? ` ${formatDate(a.weighedOn)}` : ''}
            </Badge>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The projected day at target, the model used and why, and its uncertainty. */
export function ProjectionCard({ group, unit }: { group: GrowOutGroupDto; unit: WeightUnit }) {
  const p = group.projection;
  return (
    <section aria-labelledby="projection-heading" className="space-y-2">
      <h2 id="projection-heading" className="text-lg font-semibold">Projected at {weight(group.targetGrams, unit)}</h2>
      {p.status === 'projected' && p.projectedOn ? (
        <p className="text-2xl font-semibold text-moss-deep" data-testid="projected-date">{formatDate(p.projectedOn)}</p>
      ) : p.status === 'reached' && p.reachedOn ? (
        <p className="text-2xl font-semibold text-moss-deep" data-testid="projected-date">At target since {formatDate(p.reachedOn)}</p>
      ) : (
        <p className="text-lg text-grey-700" data-testid="projected-date">{p.message}</p>
      )}
      {p.interval && (
        <p>
          {Math.round(p.interval.level * 100)} % interval: <strong>{formatDate(p.interval.from)}</strong> to <strong>{formatDate(p.interval.to)}</strong>
        </p>
      )}
      <details className="text-sm">
        <summary className="min-h-11 cursor-pointer py-2 font-semibold text-moss-deep">How is this worked out?</summary>
        <p>
          <span className="font-semibold">Model: {p.modelName}.</span> {p.why}
        </p>
        <p className="text-grey-600">{p.model.description}</p>
      </details>
    </section>
  );
}

interface WeighInValues {
  mode: 'total' | 'each';
  weighedOn: string;
  /** The total in the farm's units. */
  major: string;
  minor: string;
  headCount: string;
  kits: { label: string; major: string; minor: string }[];
}

/** A group weigh-in: the total on the scale and the head count, or each kit with an optional label. */
export function GroupWeighInForm({ group, unit, isApprentice }: { group: GrowOutGroupDto; unit: WeightUnit; isApprentice: boolean }) {
  const save = useWeighGroup();
  const today = useFarmToday();
  // Kits left blank are not sent; the body's "kits.<i>" is the i-th weighed kit, mapped back to its row.
  const weighedRows = (kits: WeighInValues['kits']) => kits.flatMap((k, index) => (k.major.trim() !== '' || k.minor.trim() !== '' ? [index] : []));
  const fieldOf = (path: string): Path<WeighInValues> | null => {
    const kit = /^kits\.(\d+)\./.exec(path);
    if (kit) {
      const row = weighedRows(form.getValues('kits'))[Number(kit[1])];
      return row === undefined ? null : `kits.${row}.major`;
    }
    return ({ weighedOn: 'weighedOn', totalGrams: 'major', headCount: 'headCount' } as const)[path as 'weighedOn'] ?? null;
  };
  const form = useForm<WeighInValues, unknown, GroupWeighInCreateBody>({
    resolver: sharedSchemaResolver(
      groupWeighInCreateSchema,
      (v, refuse) => {
        if (v.mode === 'total') {
          return { weighedOn: v.weighedOn, totalGrams: weightInputToGrams(v.major, v.minor, unit) ?? NaN, headCount: typedNumber(v.headCount) };
        }
        const rows = weighedRows(v.kits);
        if (rows.length === 0) refuse('root', "Enter at least one kit's weight");
        return {
          weighedOn: v.weighedOn,
          kits: rows.map((row) => ({ label: v.kits[row]!.label.trim() || undefined, grams: weightInputToGrams(v.kits[row]!.major, v.kits[row]!.minor, unit) ?? NaN })),
        };
      },
      (path) => fieldOf(path),
    ),
    defaultValues: {
      mode: 'total',
      weighedOn: today,
      major: '',
      minor: '',
      headCount: String(group.currentHeads),
      kits: Array.from({ length: group.currentHeads }, () => ({ label: '', major: '', minor: '' })),
    },
  });
  const { errors } = form.formState;
  const mode = form.watch('mode');
  const send = {
    mutate: (body: GroupWeighInCreateBody, options?: ServerMutateOptions<GrowOutGroupDto>) => save.mutate({ groupId: group.id, body }, options),
    reset: save.reset,
    error: save.error,
  };
  const { submit, failure } = useServerSubmit(form, send, {
    fields: fieldOf,
    onSuccess: () => {
      const v = form.getValues();
      form.reset({ ...v, major: '', minor: '', kits: v.kits.map((k) => ({ ...k, major: '', minor: '' })) });
    },
  });
  const small = unit === 'lb_oz' ? 'oz' : 'g';
  const big = unit === 'lb_oz' ? 'lb' : 'kg';
  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Weigh the group">
      <SegmentedFilter
        label="How was the group weighed?"
        value={mode}
        onChange={(value) => form.setValue('mode', value)}
        options={[{ value: 'total', label: 'All together' }, { value: 'each', label: 'One by one' }]}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Weighed on" type="date" error={errors.weighedOn?.message} {...form.register('weighedOn')} />
        {mode === 'total' && (
          <>
            <WeightInput label="Total weight" unit={unit} error={errors.major?.message} majorProps={form.register('major')} minorProps={form.register('minor')} />
            <TextField label="Head count" inputMode="numeric" error={errors.headCount?.message} {...form.register('headCount')} />
          </>
        )}
      </div>
      {mode === 'each' && (
        <fieldset className="space-y-2">
          <legend className="font-semibold">Each kit</legend>
          <p className="text-sm text-grey-600">Give a kit a label (an ear mark or a tag) to follow its own gain from one weigh-in to the next.</p>
          <ul className="space-y-2">
            {form.getValues('kits').map((_, i) => (
              <li key={i} className="grid grid-cols-3 gap-2">
                <TextField label={`Kit ${i + 1} label`} {...form.register(`kits.${i}.label`)} />
                <TextField label={`Kit ${i + 1} (${big})`} inputMode="decimal" error={errors.kits?.[i]?.major?.message} {...form.register(`kits.${i}.major`)} />
                <TextField label={`Kit ${i + 1} (${small})`} inputMode="decimal" {...form.register(`kits.${i}.minor`)} />
              </li>
            ))}
          </ul>
          {errors.root?.message && <p className="text-sm font-medium text-clay-deep">{errors.root.message}</p>}
        </fieldset>
      )}
      <Button type="submit" isBusy={save.isPending}>
        Save weigh-in
      </Button>
      {save.isSuccess && <Alert tone="success">{isApprentice ? 'Saved. It counts once your mentor accepts it.' : 'Weigh-in saved; the projection is updated.'}</Alert>}
      {failure && failure !== errors.root?.message && <Alert tone="error">{failure}</Alert>}
    </form>
  );
}

/** Every weigh-in of the group, newest first; a member reviews an apprentice's. */
export function GroupWeighInsList({ group, unit }: { group: GrowOutGroupDto; unit: WeightUnit }) {
  const review = useReviewGroupWeighIn(group.id);
  if (group.weighIns.length === 0) return <p className="text-grey-600">No weigh-ins yet.</p>;
  return (
    <ul className="divide-y divide-grey-200" aria-label="Weigh-ins">
      {[...group.weighIns].reverse().map((w) => (
        <li key={w.id} className="space-y-1 py-3">
          <p className="flex flex-wrap items-center gap-2">
            <strong>{formatDate(w.weighedOn)}</strong>
            <span>day {w.ageDays}</span>
            <span>· {weight(w.gramsPerHead, unit)} a head × {w.headCount}</span>
            <span className="text-grey-600">(total {weight(w.totalGrams, unit)})</span>
            {w.reviewState === 'pending' && <Badge tone="straw">Waiting for review</Badge>}
            {w.reviewState === 'returned' && <Badge tone="clay">Returned</Badge>}
          </p>
          {w.kits && (
            <p className="text-sm text-grey-700">
              One by one: {w.kits.map((k, i) => `${k.label ?? `kit ${i + 1}`} ${weight(k.grams, unit)}`).join(', ')}
            </p>
          )}
          {w.caution && <p className="text-sm text-clay-deep">{w.caution}</p>}
          <p className="text-sm text-grey-600">by {w.enteredBy.name}</p>
          {w.reviewState === 'pending' && group.canEdit && (
            <div className="flex gap-2">
              <Button variant="secondary" isBusy={review.isPending} onClick={() => review.mutate({ weighInId: w.id, body: { decision: 'accepted', version: w.version } })}>
                Accept
              </Button>
              <Button variant="quiet" onClick={() => review.mutate({ weighInId: w.id, body: { decision: 'returned', version: w.version } })}>
                Return
              </Button>
            </div>
          )}
        </li>
      ))}
    </ul>
  );
}

/** Gains between weigh-ins and overall, and each labelled kit's. */
export function GainsPanel({ group, unit }: { group: GrowOutGroupDto; unit: WeightUnit }) {
  return (
    <section aria-labelledby="gain-heading" className="space-y-2">
      <h2 id="gain-heading" className="text-lg font-semibold">Daily gain</h2>
      <p>
        Overall: <strong>{gainPerDay(group.gain.gramsPerDay, unit)}</strong>
        {group.gain.fromOn && group.gain.toOn && group.gain.days > 0 && <span className="text-grey-600"> over {countOf(group.gain.days, 'day')}</span>}
      </p>
      {group.gain.periods.length > 0 && (
        <ul className="text-sm">
          {group.gain.periods.map((p) => (
            <li key={p.fromOn}>
              {formatDate(p.fromOn)} → {formatDate(p.toOn)}: {gainPerDay(p.gramsPerDay, unit)}
            </li>
          ))}
        </ul>
      )}
      {group.kitGains.length > 0 && (
        <div>
          <h3 className="font-semibold">Each labelled kit</h3>
          <ul className="text-sm">
            {group.kitGains.map((k) => (
              <li key={k.label}>
                {k.label}: {weight(k.latestGrams, unit)} now, {gainPerDay(k.gramsPerDay, unit)} ({k.weighIns} weigh-ins)
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

/** Feed conversion and, for members, feed cost per pound or kilogram of live-weight gain. */
export function FeedPanel({ group, unit }: { group: GrowOutGroupDto; unit: WeightUnit }) {
  const money = useMoney();
  const f = group.feed;
  return (
    <section aria-labelledby="feed-heading" className="space-y-2">
      <h2 id="feed-heading" className="text-lg font-semibold">Feed conversion</h2>
      <p>
        Feed given: <strong>{f.feedGrams > 0 ? weight(f.feedGrams, unit) : 'none recorded yet'}</strong> (its own and its share of pen- and farm-wide feed)
      </p>
      <p>
        Live-weight gain: <strong>{f.gainGrams === null ? '—' : weight(f.gainGrams, unit)}</strong> · Feed conversion:{' '}
        <strong data-testid="feed-conversion">{f.conversion === null ? '—' : `${f.conversion.toFixed(2)} : 1`}</strong>
      </p>
      <p className="text-sm text-grey-600">Published for grow-out on pellets: {f.publishedConversion.ratio} : 1 ({f.publishedConversion.source}).</p>
      {group.canSeeMoney && (
        <p>
          Feed cost: <strong>{money(f.feedCostCents)}</strong> ·{' '}
          {unit === 'lb_oz' ? <>per lb of live-weight gain <strong>{money(f.costPerLbLiveCents)}</strong></> : <>per kg of live-weight gain <strong>{money(f.costPerKgLiveCents)}</strong></>}
        </p>
      )}
    </section>
  );
}

/** Closes the group on a date (kits processed, sold or kept); a second editor's change first is caught by the version. */
export function CloseGroupForm({ group }: { group: GrowOutGroupDto }) {
  const save = useCloseGroup();
  const form = useForm<{ closedOn: string }, unknown, GrowOutGroupCloseInput>({
    resolver: sharedSchemaResolver(growOutGroupCloseSchema, (v) => ({ closedOn: v.closedOn, version: group.version })),
    defaultValues: { closedOn: useFarmToday() },
  });
  const send = {
    mutate: (body: GrowOutGroupCloseInput, options?: ServerMutateOptions<GrowOutGroupDto>) => save.mutate({ groupId: group.id, body }, options),
    reset: save.reset,
    error: save.error,
  };
  const { submit, failure } = useServerSubmit(form, send);
  return (
    <form className="flex flex-wrap items-end gap-3" aria-label="Close the group" noValidate onSubmit={submit}>
      <TextField label="Closed on" type="date" error={form.formState.errors.closedOn?.message} {...form.register('closedOn')} />
      <Button type="submit" variant="secondary" isBusy={save.isPending}>
        Close group
      </Button>
      {failure && <Alert tone="error">{failure}</Alert>}
    </form>
  );
}
