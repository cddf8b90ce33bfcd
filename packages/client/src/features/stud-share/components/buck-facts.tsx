import type { BuckCardDto, GetRecordDto, StudHealthDto, WeightUnit } from '@burrowline/shared';
import { Badge } from '../../../components/ui/badge';
import { formatDate } from '../../../lib/days';
import { gainPerDay, weight } from '../../../lib/weights';

type Money = (cents: number | null) => string;

/** The fee in words; null where fees are hidden (an apprentice never sees money). */
export function feeText(card: Pick<BuckCardDto, 'feesVisible' | 'loan' | 'service' | 'loanFeeCents' | 'serviceFeeCents'>, money: Money): string | null {
  if (!card.feesVisible) return null;
  const one = (cents: number | null) => (cents ? money(cents) : 'no fee');
  const parts = [card.loan ? `Loan: ${one(card.loanFeeCents)}` : null, card.service ? `Service: ${one(card.serviceFeeCents)}` : null].filter(Boolean);
  return parts.join(' · ');
}

export function OfferKinds({ card }: { card: Pick<BuckCardDto, 'loan' | 'service'> }) {
  return (
    <span className="inline-flex flex-wrap gap-1.5">
      {card.loan && <Badge tone="moss">Loan</Badge>}
      {card.service && <Badge tone="straw">Stud service</Badge>}
    </span>
  );
}

/** Where he is now: away on a loan, or at home and free to ask for. */
export function Whereabouts({ card }: { card: Pick<BuckCardDto, 'onLoanTo' | 'status'> }) {
  if (card.status === 'withdrawn') return <Badge tone="neutral">Withdrawn</Badge>;
  return card.onLoanTo ? <Badge tone="straw">On loan at {card.onLoanTo.name}</Badge> : <Badge tone="moss">At home</Badge>;
}

const percent = (fraction: number | null) => (fraction === null ? '—' : `${Math.round(fraction * 1000) / 10} %`);
const one = (value: number | null) => (value === null ? '—' : String(Math.round(value * 10) / 10));

/** His get's record as a short definition list; dashes where the records are too few. */
export function GetRecordFacts({ record, unit }: { record: GetRecordDto; unit: WeightUnit }) {
  if (record.littersSired === 0) return <p className="text-grey-600">No litters of his on the co-op's shared records yet.</p>;
  const rows: [string, string][] = [
    ['Litters sired', String(record.littersSired)],
    ['Born alive, mean', one(record.meanBornAlive)],
    ['Weaned, mean', one(record.meanWeaned)],
    ["Get's daily gain", gainPerDay(record.meanDailyGainGrams, unit)],
    ['Age at target weight', record.meanDaysToTarget === null ? '—' : `${Math.round(record.meanDaysToTarget)} days`],
    ['Dress-out', percent(record.meanDressOut)],
  ];
  return <Facts rows={rows} label="Get's record" />;
}

export function HealthFacts({ health }: { health: StudHealthDto }) {
  const rows: [string, string][] = [
    ['Proven', health.proven ? `Yes, ${health.littersSired} litter${health.littersSired === 1 ? '' : 's'} on record` : 'Not yet: no litter on record'],
    ['Last health check', health.lastHealthCheckOn ? formatDate(health.lastHealthCheckOn) : 'Not given'],
    ['RHDV2 vaccination', health.rhdv2VaccinatedOn ? formatDate(health.rhdv2VaccinatedOn) : 'None given'],
    ['Known conditions', health.knownConditions || 'None given'],
  ];
  return <Facts rows={rows} label="Health" />;
}

export function WeightFacts({ card, unit }: { card: Pick<BuckCardDto, 'weights'>; unit: WeightUnit }) {
  const latest = card.weights.at(-1);
  if (!latest) return <p className="text-grey-600">His farm shares no weights.</p>;
  return (
    <p>
      <span className="font-semibold">{weight(latest.grams, unit)}</span> <span className="text-grey-600">on {formatDate(latest.weighedOn)}</span>
      {card.weights.length > 1 && <span className="text-grey-600"> ({card.weights.length} weigh-ins shared)</span>}
    </p>
  );
}

export function Facts({ rows, label }: { rows: [string, string][]; label: string }) {
  return (
    <dl aria-label={label} className="grid grid-cols-[minmax(0,auto)_minmax(0,1fr)] gap-x-4 gap-y-1.5">
      {rows.map(([term, value]) => (
        <div key={term} className="contents">
          <dt className="text-grey-600">{term}</dt>
          <dd className="font-medium break-words">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
