import { useState } from 'react';
import { Delete } from 'lucide-react';
import {
  checkRoundWeight, DROP_WARNING_FRACTION, ErrorCode, formatWeight, gramsToWeightInput, type EntryCheck, type WeighingRoundCandidateDto, type WeighingRoundCandidatesDto, type WeightUnit,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { ProgressBar } from '../../../components/ui/progress-bar';
import { isApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { formatDate } from '../../../lib/days';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { useSaveRound } from '../api/weighing-round-api';
import { emptyPad, firstBox, padGrams, pressKey, type PadBox, type PadValue } from '../pad-keys';

interface Weighed { grams: number; confirmed: boolean }

const KEYS = ['1', '2', '3', '4', '5', '6', '7', '8', '9', '.', '0', '⌫'] as const;

/**
 * The check the server makes, on the phone first (a kit's litter-mates are not told apart, so only an
 * animal's own last weight shows a drop), said in the farm's units.
 */
function checkOf(c: WeighingRoundCandidateDto, grams: number, today: string, w: (g: number) => string): EntryCheck | null {
  const last = c.kind === 'animal' ? c.last : null;
  const check = checkRoundWeight({ gramsPerHead: grams, ageDays: c.ageDays, sizeClass: c.sizeClass, weighedOn: today, last });
  if (!check) return null;
  const age = c.ageDays !== null ? ` at ${c.ageDays} days` : '';
  if (check.level === 'error') {
    return { level: 'error', message: `${w(grams)} is not possible${age}${c.band ? ` (about ${w(c.band.expectedGrams)} is usual)` : ''}; check the scale and weigh again` };
  }
  if (last && grams < last.gramsPerHead * (1 - DROP_WARNING_FRACTION)) {
    return { level: 'warning', message: `${w(grams)} is ${w(last.gramsPerHead - grams)} less than on ${formatDate(last.weighedOn)} (${w(last.gramsPerHead)})` };
  }
  const light = c.band !== null && grams < c.band.lowGrams;
  return { level: 'warning', message: `${w(grams)} is ${light ? 'light' : 'heavy'}${age}${c.band ? `: ${w(c.band.lowGrams)} – ${w(c.band.highGrams)} is usual` : ''}` };
}

function entryOf(c: WeighingRoundCandidateDto, w: Weighed) {
  const subject = c.kind === 'animal' ? { animalId: c.id } : c.kind === 'group' ? { groupId: c.id } : { litterId: c.id };
  return { ...subject, grams: w.grams, confirmed: w.confirmed };
}

/**
 * One head after another: its last weight and the usual band for its age beside a big number pad in the
 * farm's units; an implausible weight asks to be kept or weighed again; the round is saved at the end as
 * one batch (its id, made once, lets a retried save answer the first).
 */
export function WeighingRound({ round, unit, isApprentice, doneHref }: { round: WeighingRoundCandidatesDto; unit: WeightUnit; isApprentice: boolean; doneHref: string }) {
  const candidates = round.candidates;
  const [roundId] = useState(newIdempotencyKey);
  const [index, setIndex] = useState(0);
  const [weighed, setWeighed] = useState<Map<number, Weighed>>(new Map());
  const [pad, setPad] = useState<PadValue>(emptyPad);
  const [box, setBox] = useState<PadBox>(firstBox(unit));
  const [problem, setProblem] = useState<EntryCheck | null>(null);
  const [reviewing, setReviewing] = useState(candidates.length === 0);
  const [serverWarnings, setServerWarnings] = useState<Map<number, string>>(new Map());
  const save = useSaveRound();
  const current = candidates[index];
  const grams = padGrams(pad, unit);
  const w = (g: number) => formatWeight(g, unit);

  const show = (at: number) => {
    const known = weighed.get(at);
    setIndex(at);
    setPad(known ? (unit === 'lb_oz' ? gramsToWeightInput(known.grams, unit) : { major: '', minor: String(known.grams) }) : emptyPad);
    setBox(firstBox(unit));
    setProblem(null);
  };
  const advance = (from: number) => (from + 1 >= candidates.length ? (setReviewing(true), setProblem(null)) : show(from + 1));
  const record = (value: Weighed) => {
    setWeighed((m) => new Map(m).set(index, value));
    advance(index);
  };
  const next = () => {
    if (!current) return;
    if (grams === null) return setProblem({ level: 'error', message: 'Type the weight, or skip this one' });
    const check = checkOf(current, grams, round.today, w);
    if (check?.level === 'error') return setProblem(check);
    if (check) return setProblem(check);
    record({ grams, confirmed: false });
  };
  const skip = () => {
    setWeighed((m) => {
      const copy = new Map(m);
      copy.delete(index);
      return copy;
    });
    advance(index);
  };
  const press = (key: string) => {
    setProblem(null);
    setPad((p) => ({ ...p, [box]: pressKey(p[box], key, unit === 'lb_oz' && box === 'minor') }));
  };

  const submit = (confirmAll: boolean) => {
    const order = [...weighed.keys()].sort((a, b) => a - b);
    const entries = order.map((i) => {
      const value = weighed.get(i)!;
      return entryOf(candidates[i]!, confirmAll && serverWarnings.has(i) ? { ...value, confirmed: true } : value);
    });
    save.mutate(
      { id: roundId, weighedOn: round.today, entries },
      {
        onError: (error) => {
          if (!isApiError(error, ErrorCode.confirmationRequired)) return;
          const found = new Map<number, string>();
          for (const [field, messages] of Object.entries(error.details)) {
            const at = /^entries\.(\d+)\./.exec(field);
            if (at) found.set(order[Number(at[1])]!, messages[0] ?? 'Check this weight');
          }
          setServerWarnings(found);
        },
      },
    );
  };

  if (save.isSuccess) {
    return (
      <Alert
        tone="success"
        title={`Saved ${save.data.weighIns.length === 1 ? 'one weigh-in' : `${save.data.weighIns.length} weigh-ins`} (${weighed.size} weight${weighed.size === 1 ? '' : 's'})`}
        actions={<LinkButton to={doneHref} variant="secondary">Done</LinkButton>}
      >
        {isApprentice ? 'They wait for your mentor’s review and count once accepted.' : 'They show on each animal, group and litter now.'}
      </Alert>
    );
  }

  if (reviewing) {
    const count = weighed.size;
    return (
      <div className="space-y-4">
        {/* The save comes first: a long round's list need not be scrolled to reach it. */}
        <div>
          <h2 className="text-xl font-semibold">Check and save</h2>
          <p className="text-grey-600">{count} weighed, {candidates.length - count} skipped. Tap a name to weigh it again.</p>
        </div>
        {save.isError && !isApiError(save.error, ErrorCode.confirmationRequired) && <Alert tone="error">{save.error.message}</Alert>}
        {serverWarnings.size > 0 && (
          <Alert tone="warning" title="Some weights look unusual">Weigh them again, or keep them as they are.</Alert>
        )}
        <div className="flex flex-wrap gap-3">
          {candidates.length > 0 && (
            <Button variant="secondary" onClick={() => (setReviewing(false), show(Math.min(index, candidates.length - 1)))}>
              Back to weighing
            </Button>
          )}
          {count > 0 && (
            <Button isBusy={save.isPending} onClick={() => submit(serverWarnings.size > 0)}>
              {serverWarnings.size > 0 ? 'Keep them and save' : `Save ${count} weight${count === 1 ? '' : 's'}`}
            </Button>
          )}
        </div>
        <Card className="space-y-3">
          {candidates.length === 0 && <p className="text-grey-600">Nothing to weigh here.</p>}
          <ul className="divide-y divide-grey-100" aria-label="Weights of this round">
            {candidates.map((c, i) => {
              const value = weighed.get(i);
              const warning = serverWarnings.get(i);
              return (
                <li key={`${c.id}-${c.kitNumber ?? 0}`} className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1 py-2">
                  <button type="button" className="min-h-11 min-w-0 flex-1 text-left font-medium text-bark" onClick={() => (setReviewing(false), show(i))}>
                    {c.label}
                  </button>
                  <span className={cn('tabular-nums', value ? 'font-semibold' : 'text-grey-500')}>{value ? w(value.grams) : 'skipped'}</span>
                  {value?.confirmed && <span className="w-full text-sm text-grey-600">Kept after a warning</span>}
                  {warning && <span className="w-full text-sm text-clay-deep">{warning}</span>}
                </li>
              );
            })}
          </ul>
        </Card>
      </div>
    );
  }

  const c = current!;
  const boxes: { box: PadBox; suffix: string }[] = unit === 'lb_oz' ? [{ box: 'major', suffix: 'lb' }, { box: 'minor', suffix: 'oz' }] : [{ box: 'minor', suffix: 'g' }];
  return (
    <div className="space-y-4">
      <ProgressBar label={round.title} value={index / candidates.length} detail={`${index + 1} of ${candidates.length}`} />
      <div className="grid gap-4 md:grid-cols-2">
        <Card className="space-y-3">
          <div>
            <h2 className="text-2xl font-bold text-bark" aria-live="polite">{c.label}</h2>
            <p className="text-grey-600">{[c.detail !== c.label ? c.detail : null, c.ageDays !== null ? `${c.ageDays} days old` : 'age not known'].filter(Boolean).join(' · ')}</p>
          </div>
          <dl className="grid grid-cols-2 gap-2 text-sm">
            <div className="rounded-lg bg-oat p-2">
              <dt className="text-grey-600">{c.kind === 'animal' ? 'Last weight' : 'Last, a head'}</dt>
              <dd className="font-semibold tabular-nums">{c.last ? `${w(c.last.gramsPerHead)}` : 'none yet'}</dd>
              {c.last && <dd className="text-grey-600">{formatDate(c.last.weighedOn)}</dd>}
            </div>
            <div className="rounded-lg bg-oat p-2">
              <dt className="text-grey-600">Usual for the age</dt>
              <dd className="font-semibold tabular-nums">{c.band ? `${w(c.band.lowGrams)} – ${w(c.band.highGrams)}` : 'age not known'}</dd>
              {c.band && <dd className="text-grey-600">about {w(c.band.expectedGrams)}</dd>}
            </div>
          </dl>
          <div className="flex gap-2" role="group" aria-label="Weight">
            {boxes.map((b) => (
              <button
                key={b.box}
                type="button"
                aria-label={b.suffix === 'lb' ? 'Pounds' : b.suffix === 'oz' ? 'Ounces' : 'Grams'}
                aria-pressed={box === b.box}
                onClick={() => setBox(b.box)}
                className={cn(
                  'flex min-h-16 min-w-0 flex-1 items-baseline justify-end gap-1 rounded-xl border-2 px-3 text-right text-4xl font-bold tabular-nums',
                  box === b.box ? 'border-moss bg-white' : 'border-grey-200 bg-grey-50',
                )}
              >
                <span data-testid={`pad-${b.suffix}`}>{pad[b.box] || '0'}</span>
                <span className="text-lg font-semibold text-grey-600">{b.suffix}</span>
              </button>
            ))}
          </div>
          {grams !== null && unit === 'lb_oz' && <p className="text-right text-sm text-grey-600 tabular-nums">{grams} g</p>}
          {problem && (
            <Alert
              tone={problem.level === 'error' ? 'error' : 'warning'}
              title={problem.level === 'error' ? 'Not possible' : 'Is that right?'}
              actions={problem.level === 'warning' && grams !== null ? (
                <>
                  <Button variant="secondary" onClick={() => (setPad(emptyPad), setBox(firstBox(unit)), setProblem(null))}>Weigh again</Button>
                  <Button onClick={() => record({ grams, confirmed: true })}>Keep {w(grams)}</Button>
                </>
              ) : undefined}
            >
              {problem.message}
            </Alert>
          )}
        </Card>
        <div className="space-y-3">
          <div className="grid grid-cols-3 gap-2" aria-label="Number pad">
            {KEYS.map((key) => {
              const disabled = key === '.' && !(unit === 'lb_oz' && box === 'minor');
              return (
                <button
                  key={key}
                  type="button"
                  disabled={disabled}
                  onClick={() => press(key)}
                  aria-label={key === '⌫' ? 'Delete' : key === '.' ? 'Point' : key}
                  className="flex h-16 items-center justify-center rounded-xl border-2 border-grey-200 bg-white text-3xl font-semibold text-bark active:bg-moss-wash disabled:opacity-30"
                >
                  {key === '⌫' ? <Delete className="size-7" aria-hidden="true" /> : key}
                </button>
              );
            })}
          </div>
          <div className="grid grid-cols-3 gap-2">
            <Button variant="secondary" disabled={index === 0} onClick={() => show(index - 1)}>Back</Button>
            <Button variant="secondary" onClick={skip}>Skip</Button>
            <Button onClick={next}>Next</Button>
          </div>
          <Button variant="quiet" className="w-full" onClick={() => (setReviewing(true), setProblem(null))}>
            Finish and check ({weighed.size} weighed)
          </Button>
        </div>
      </div>
    </div>
  );
}
