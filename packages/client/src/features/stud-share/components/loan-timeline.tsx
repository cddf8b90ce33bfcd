import { Check } from 'lucide-react';
import type { StudCustodyStepDto, StudLoanDto, WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { cn } from '../../../lib/cn';
import { formatDate } from '../../../lib/days';
import { formatInstant, formatInstantDate } from '../../../lib/dates';
import { weight } from '../../../lib/weights';

interface Stage {
  key: string;
  label: string;
  /** The day it happened, written out (a custody step's date, else the day it was recorded); null while to come. */
  on: string | null;
  detail?: string;
}

const dayOf = (instant: string | undefined) => (instant ? formatInstantDate(instant) : null);

/** requested → accepted → handed over → returned (a visit: requested → accepted → visit done). */
function stagesOf(loan: StudLoanDto): Stage[] {
  const at = (...kinds: string[]) => loan.timeline.find((e) => kinds.includes(e.kind))?.at;
  const ended = loan.state === 'declined' || loan.state === 'cancelled';
  const stages: Stage[] = [
    { key: 'requested', label: 'Requested', on: dayOf(loan.createdAt) },
    { key: 'accepted', label: 'Accepted', on: dayOf(at('accepted', 'proposal_accepted')) },
  ];
  if (loan.kind === 'loan') {
    stages.push(
      { key: 'handed_over', label: 'Handed over', on: loan.handOver ? formatDate(loan.handOver.on) : null, detail: loan.handOver && !loan.handOver.confirmedAt ? 'waiting for the other farm to confirm' : undefined },
      { key: 'returned', label: 'Returned', on: loan.return ? formatDate(loan.return.on) : null, detail: loan.return && !loan.return.confirmedAt ? 'waiting for the other farm to confirm' : undefined },
    );
  } else {
    stages.push({ key: 'served', label: 'Visit done', on: dayOf(at('served')) });
  }
  if (ended) {
    const last = loan.state === 'declined' ? 'Declined' : 'Cancelled';
    const kept = stages.filter((s) => s.on !== null);
    kept.push({ key: loan.state, label: last, on: dayOf(at(loan.state === 'declined' ? 'declined' : 'cancelled')), detail: loan.declineReason ?? undefined });
    return kept;
  }
  return stages;
}

/** The loan's road as four stops with their dates: what happened is ticked, what is to come is grey. */
export function LoanStages({ loan }: { loan: StudLoanDto }) {
  const stages = stagesOf(loan);
  return (
    <ol className="grid grid-cols-2 gap-2 sm:grid-flow-col sm:auto-cols-fr sm:grid-cols-none" aria-label="Where the loan stands" data-testid="loan-stages">
      {stages.map((s, i) => {
        const done = s.on !== null;
        const stopped = s.key === 'declined' || s.key === 'cancelled';
        return (
          <li
            key={s.key}
            className={cn(
              'flex items-start gap-2 rounded-xl border-2 p-2.5 sm:flex-col sm:p-3',
              stopped ? 'border-clay/50 bg-clay-wash' : done ? 'border-moss bg-moss-wash' : 'border-dashed border-grey-300 bg-white text-grey-600',
            )}
            aria-current={done && stages[i + 1]?.on === null ? 'step' : undefined}
          >
            <span className={cn('flex size-7 shrink-0 items-center justify-center rounded-full text-sm font-bold', done ? 'bg-moss text-white' : 'bg-grey-100')} aria-hidden="true">
              {done ? <Check className="size-4" /> : i + 1}
            </span>
            <span className="min-w-0">
              <span className="block font-semibold">{s.label}</span>
              <span className="block text-sm">{s.on ?? 'To come'}</span>
              {s.detail && <span className="block text-sm break-words">{s.detail}</span>}
            </span>
          </li>
        );
      })}
    </ol>
  );
}

/** A hand-over or a return as recorded: date, his weight, condition, photo, who recorded and who confirmed. */
export function CustodyStep({ title, step, unit }: { title: string; step: StudCustodyStepDto; unit: WeightUnit }) {
  return (
    <section aria-label={title} className="space-y-2 rounded-xl border border-grey-200 p-4" data-testid={`custody-${title.toLowerCase().replace(/\s+/g, '-')}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="font-bold">{title}: {formatDate(step.on)}</h3>
        {step.confirmedAt ? <Badge tone="moss">Confirmed by {step.confirmedBy?.name}</Badge> : <Badge tone="straw">Waiting for confirmation</Badge>}
      </div>
      <div className="flex flex-wrap gap-4">
        {step.photo && <img src={step.photo.url} alt={`${title}: the buck`} className="size-24 rounded-lg object-cover" loading="lazy" />}
        <dl className="min-w-0 flex-1 space-y-1 text-sm">
          <div><dt className="inline text-grey-600">His weight: </dt><dd className="inline font-semibold">{step.weightGrams === null ? 'not weighed' : weight(step.weightGrams, unit)}</dd></div>
          {step.conditionNotes && <div><dt className="inline text-grey-600">Condition: </dt><dd className="inline break-words">{step.conditionNotes}</dd></div>}
          <div><dt className="inline text-grey-600">Recorded by </dt><dd className="inline">{step.recordedBy.name}, {formatInstant(step.recordedAt)}</dd></div>
        </dl>
      </div>
    </section>
  );
}

/** Every step of the loan: who, when, what. */
export function LoanHistory({ loan }: { loan: StudLoanDto }) {
  return (
    <ol className="space-y-3 border-l-2 border-grey-200 pl-4" aria-label="History" data-testid="loan-history">
      {[...loan.timeline].reverse().map((e) => (
        <li key={e.id} className="relative">
          <span className="absolute top-1.5 -left-[1.4rem] size-3 rounded-full bg-moss" aria-hidden="true" />
          <p className="font-medium break-words">{e.text}</p>
          <p className="text-sm text-grey-600">
            {formatInstant(e.at)}
            {e.by ? ` · ${e.by.name}` : ''}
            {e.farm ? `, ${e.farm.name}` : ''}
          </p>
        </li>
      ))}
    </ol>
  );
}
