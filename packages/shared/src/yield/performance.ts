import { kindlingStatus } from '../breeding/plan';
import type { CycleSettings } from '../breeding/cycle-settings';
import { litterSummary, type LitterRecord, type LitterSummary } from '../breeding/litter-count';
import { daysBetween } from '../herd/herd-dates';

/**
 * Per-doe and per-buck figures from plain records (services with their outcome, litters with their
 * events, carcasses). Rates a year are over the period the animal was in production: from the later of
 * the period's start and her first service, to the period's end.
 */

export const PRODUCTIVITY_TARGET = Object.freeze({
  kitsWeanedPerYear: 35,
  littersPerYear: 5,
  source: 'McNitt et al., Rabbit Production, 9th ed.: ≈ 35 young weaned per doe per year (≈ 5 litters)',
});

export type ServiceOutcome = 'kindled' | 'missed' | 'open';

/**
 * How a service turned out: kindled when a kindling is recorded; missed when she palpated empty, the
 * breeder closed it as missed, or the kindling window passed with no kindling; otherwise still open.
 */
export function serviceOutcome(
  service: { servicedOn: string; palpation?: 'positive' | 'negative' | null; kindledOn?: string | null; closedAsMissed?: boolean },
  today: string,
  settings: CycleSettings,
): ServiceOutcome {
  if (service.kindledOn) return 'kindled';
  if (service.closedAsMissed || service.palpation === 'negative') return 'missed';
  return kindlingStatus(service.servicedOn, today, settings) === 'missed' ? 'missed' : 'open';
}

export interface ServiceRecord {
  servicedOn: string;
  outcome: ServiceOutcome;
}

export interface PerformanceLitter extends LitterRecord {
  /** Total live weight of the litter at weaning, when weighed. */
  weaningWeightGrams?: number | null;
}

export interface PerformancePeriod {
  from: string;
  to: string;
}

export interface DoePerformance {
  /** The production period the rates are over, in days and years. */
  from: string;
  to: string;
  days: number;
  years: number;
  services: number;
  kindled: number;
  missed: number;
  /** kindled ÷ (kindled + missed); open services do not count. */
  conceptionRate: number | null;
  litters: number;
  littersPerYear: number | null;
  /** Mean days between consecutive kindlings (the later one in the period). */
  kindlingIntervalDays: number | null;
  averageBornAlive: number | null;
  averageTotalBorn: number | null;
  /** Per litter, over litters with nothing left on the doe. */
  averageWeaned: number | null;
  /** Σ weaned ÷ Σ raised over weaned litters (raised = born alive + fostered in − fostered out). */
  survivalToWeaning: number | null;
  averageLitterWeaningGrams: number | null;
  /** Kits weaned on dates in the period, a year. */
  kitsWeanedPerYear: number | null;
  /** Carcass grams of her young processed in the period, a year. */
  carcassGramsPerYear: number | null;
  /** Her latest services missed one after another (0 when the latest kindled). */
  missedInARow: number;
  /** The litters in the period, oldest first, with their summaries. */
  litterSummaries: (LitterSummary & { kindledOn: string; weaningWeightGrams: number | null })[];
}

const mean = (values: number[]) => (values.length > 0 ? values.reduce((s, v) => s + v, 0) / values.length : null);
const inPeriod = (date: string, p: PerformancePeriod) => date >= p.from && date <= p.to;
const byDate = <T>(date: (x: T) => string) => (a: T, b: T) => (date(a) < date(b) ? -1 : date(a) > date(b) ? 1 : 0);
const byKindledOn = (a: { kindledOn: string }, b: { kindledOn: string }) => (a.kindledOn < b.kindledOn ? -1 : a.kindledOn > b.kindledOn ? 1 : 0);

/** Services missed one after another at the end of the record (open services are passed over). */
export function missedInARow(services: ReadonlyArray<ServiceRecord>): { count: number; dates: string[] } {
  const decided = services.filter((s) => s.outcome !== 'open').sort(byDate((s) => s.servicedOn));
  const dates: string[] = [];
  for (let i = decided.length - 1; i >= 0 && decided[i]!.outcome === 'missed'; i--) dates.unshift(decided[i]!.servicedOn);
  return { count: dates.length, dates };
}

/** Litter summaries already worked out (the farm's tables summarize each litter once for its doe and its buck). */
export type SummaryOf = (litter: LitterRecord) => LitterSummary;

type DatedSummary = DoePerformance['litterSummaries'][number];
/** A litter's summary with its kindling and weaning weight, made once per litter object (its record is never changed). */
const datedSummaries = new WeakMap<PerformanceLitter, DatedSummary>();
function datedSummaryOf(l: PerformanceLitter, summaryOf: SummaryOf): DatedSummary {
  let s = datedSummaries.get(l);
  if (!s) {
    s = { ...summaryOf(l), kindledOn: l.kindledOn, weaningWeightGrams: l.weaningWeightGrams ?? null };
    datedSummaries.set(l, s);
  }
  return s;
}

export function doePerformance(
  records: { services: ReadonlyArray<ServiceRecord>; litters: ReadonlyArray<PerformanceLitter>; carcasses?: ReadonlyArray<{ processedOn: string; carcassGrams: number }> },
  period: PerformancePeriod,
  summaryOf: SummaryOf = litterSummary,
): DoePerformance {
  if (period.to < period.from) throw new RangeError('The period ends before it starts');
  // Plain loops over her records (a farm's tables call this for every doe): the earliest record, and
  // the services in the period with their outcomes.
  let first: string | undefined;
  for (const s of records.services) if (first === undefined || s.servicedOn < first) first = s.servicedOn;
  for (const l of records.litters) if (first === undefined || l.kindledOn < first) first = l.kindledOn;
  const from = first && first > period.from ? first : period.from;
  const days = Math.max(daysBetween(from, period.to) + 1, 0);
  const years = days / 365.25;
  const rate = (n: number) => (years > 0 ? n / years : null);

  let servicesInPeriod = 0;
  let kindled = 0;
  let missed = 0;
  for (const s of records.services) {
    if (!inPeriod(s.servicedOn, period)) continue;
    servicesInPeriod++;
    if (s.outcome === 'kindled') kindled++;
    else if (s.outcome === 'missed') missed++;
  }

  const allLitters = [...records.litters].sort(byKindledOn);
  const litters = allLitters.filter((l) => inPeriod(l.kindledOn, period));
  const summaries = litters.map((l) => datedSummaryOf(l, summaryOf));
  const intervals: number[] = [];
  for (let i = 1; i < allLitters.length; i++) {
    if (inPeriod(allLitters[i]!.kindledOn, period)) intervals.push(daysBetween(allLitters[i - 1]!.kindledOn, allLitters[i]!.kindledOn));
  }
  const weaned = summaries.filter((s) => s.onDoe === 0 && s.raised > 0);
  const raisedTotal = weaned.reduce((n, s) => n + s.raised, 0);
  const weanedInPeriod = records.litters.reduce(
    (n, l) => n + l.events.reduce((m, e) => (e.kind === 'weaned' && inPeriod(e.on, period) ? m + e.count : m), 0), 0,
  );
  const weights = summaries.map((s) => s.weaningWeightGrams).filter((w): w is number => w !== null && w > 0);
  const carcassGrams = (records.carcasses ?? []).filter((c) => inPeriod(c.processedOn, period)).reduce((n, c) => n + c.carcassGrams, 0);

  return {
    from, to: period.to, days, years,
    services: servicesInPeriod, kindled, missed,
    conceptionRate: kindled + missed > 0 ? kindled / (kindled + missed) : null,
    litters: litters.length,
    littersPerYear: rate(litters.length),
    kindlingIntervalDays: mean(intervals),
    averageBornAlive: mean(summaries.map((s) => s.bornAlive)),
    averageTotalBorn: mean(summaries.map((s) => s.totalBorn)),
    averageWeaned: mean(weaned.map((s) => s.weaned)),
    survivalToWeaning: raisedTotal > 0 ? weaned.reduce((n, s) => n + s.weaned, 0) / raisedTotal : null,
    averageLitterWeaningGrams: mean(weights),
    kitsWeanedPerYear: rate(weanedInPeriod),
    carcassGramsPerYear: records.carcasses ? rate(carcassGrams) : null,
    missedInARow: missedInARow(records.services).count,
    litterSummaries: summaries,
  };
}

export interface BuckPerformance {
  services: number;
  kindled: number;
  missed: number;
  conceptionRate: number | null;
  littersSired: number;
  averageBornAlive: number | null;
  averageWeaned: number | null;
  survivalToWeaning: number | null;
}

/** A buck's services (with any doe) and the litters he sired, in the period. */
export function buckPerformance(
  records: { services: ReadonlyArray<ServiceRecord>; litters: ReadonlyArray<LitterRecord> },
  period: PerformancePeriod,
  summaryOf: SummaryOf = litterSummary,
): BuckPerformance {
  const services = records.services.filter((s) => inPeriod(s.servicedOn, period));
  const kindled = services.filter((s) => s.outcome === 'kindled').length;
  const missed = services.filter((s) => s.outcome === 'missed').length;
  const summaries = records.litters.filter((l) => inPeriod(l.kindledOn, period)).map((l) => summaryOf(l));
  const weaned = summaries.filter((s) => s.onDoe === 0 && s.raised > 0);
  const raised = weaned.reduce((n, s) => n + s.raised, 0);
  return {
    services: services.length, kindled, missed,
    conceptionRate: kindled + missed > 0 ? kindled / (kindled + missed) : null,
    littersSired: summaries.length,
    averageBornAlive: mean(summaries.map((s) => s.bornAlive)),
    averageWeaned: mean(weaned.map((s) => s.weaned)),
    survivalToWeaning: raised > 0 ? weaned.reduce((n, s) => n + s.weaned, 0) / raised : null,
  };
}
