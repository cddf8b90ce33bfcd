import { gainSummary, groupBirthDate } from '../growth/adg';
import { addDays, daysBetween } from '../herd/herd-dates';
import { litterSummary, type LitterRecord, type LitterSummary } from '../breeding/litter-count';
import { compareByKey, type MetricSummary } from './comparison';
import { crossLabel, type CrossLabel } from './cross-label';
import { dressOutPercent } from './dress-out';
import { doeLitterFeedConversion, groupFeedConversion } from './feed-conversion';
import { feedCostPerWeight } from './feed-cost';
import { buckPerformance, doePerformance, type DoePerformance, type PerformanceLitter, type PerformancePeriod, type ServiceOutcome } from './performance';
import { keepCullSuggestions, type KeepCullSuggestion } from './suggestions';

/**
 * The farm's performance tables (per doe, per buck, per breed and cross, per grow-out group, and the
 * keep and cull suggestions) from plain records, in memory: the server loads each table once and hands
 * them here, so the work does not grow with queries per doe. How figures are attributed:
 * - a grow-out group's processing records are shared among its litters pro rata by the heads each
 *   litter put in the group; a record of one animal goes to the litter it was born in (same sire, dam
 *   and birth date);
 * - a group's gain is its end weight (the live weight at processing when it was processed after its
 *   last weigh-in, else the last weigh-in) minus its first weigh-in, plus the live weight taken out
 *   (processed) on or before the last weigh-in;
 * - a group counts for a breed or cross when all its kits are of it; a mixed group shows in the group
 *   table only;
 * - doe + litter feed conversion to weaning is all the doe-and-litter feed of her weighed litters over
 *   their weight at weaning (Kellogg 1933's measure); to market weight it adds her kits' share (by heads)
 *   of their groups' feed, over her kits' share of the groups' end weight, for groups that reached their
 *   target or were processed.
 */

export interface PerformanceAnimal {
  id: string;
  name: string;
  tattoo: string | null;
  sex: 'buck' | 'doe';
  /** The recorded breed, or the one breed its whole pedigree is of (crosses are named from it). */
  breedName: string | null;
  /** Still kept on the farm (suggestions are only for these). */
  onFarm: boolean;
}

export interface PerformanceServiceInput {
  doeId: string;
  buckId: string;
  servicedOn: string;
  outcome: ServiceOutcome;
}

export interface PerformanceLitterInput {
  id: string;
  damId: string;
  sireId: string;
  kindledOn: string;
  record: LitterRecord;
  weaningWeightGrams: number | null;
}

export interface PerformanceGroupInput {
  id: string;
  name: string;
  formedOn: string;
  status: 'growing' | 'closed';
  closedOn: string | null;
  targetGrams: number;
  litters: { litterId: string; heads: number; kindledOn: string }[];
  weighIns: { weighedOn: string; totalGrams: number; headCount: number }[];
  feedGrams: number;
  feedCostCents: number;
}

export interface PerformanceProcessingInput {
  id: string;
  processedOn: string;
  animalId: string | null;
  groupId: string | null;
  headCount: number;
  liveGrams: number;
  hotCarcassGrams: number;
}

export interface PerformanceInput {
  today: string;
  /** null: every record (from the first one to today). */
  period: PerformancePeriod | null;
  animals: ReadonlyArray<PerformanceAnimal>;
  services: ReadonlyArray<PerformanceServiceInput>;
  litters: ReadonlyArray<PerformanceLitterInput>;
  /** null when that source is not available: its figures are left out (null), and `missing` says so. */
  groups: ReadonlyArray<PerformanceGroupInput> | null;
  doeLitterFeed: ReadonlyMap<string, { grams: number; costCents: number }> | null;
  processing: ReadonlyArray<PerformanceProcessingInput> | null;
  /** Parents and birth date of animals processed one by one (to find the litter they came from). */
  processedAnimals?: ReadonlyMap<string, { sireId: string | null; damId: string | null; birthDate: string | null }>;
}

export interface AnimalRef {
  id: string;
  name: string;
  tattoo: string | null;
  breedName: string | null;
  onFarm: boolean;
}

export interface DoeRow {
  animal: AnimalRef;
  services: number;
  conceptionRate: number | null;
  missedInARow: number;
  litters: number;
  littersPerYear: number | null;
  kindlingIntervalDays: number | null;
  averageBornAlive: number | null;
  averageWeaned: number | null;
  survivalToWeaning: number | null;
  averageLitterWeaningGrams: number | null;
  kitsWeanedPerYear: number | null;
  /** Her days in service in the period, which the yearly figures are pro-rated over. */
  daysInService: number;
  carcassGramsPerYear: number | null;
  /** Doe + litter feed ÷ litter weight at weaning, over her weighed litters with feed records. */
  feedConversionToWeaning: number | null;
  /** Her kits carried on to market weight: doe + litter feed plus their share of group feed, ÷ their end weight. */
  feedConversionToMarket: number | null;
  /** Average daily gain of the groups her kits grew in (g/day), and how many groups. */
  litterGainGramsPerDay: number | null;
  groups: number;
}

export interface BuckRow {
  animal: AnimalRef;
  services: number;
  kindled: number;
  missed: number;
  conceptionRate: number | null;
  littersSired: number;
  averageBornAlive: number | null;
  averageWeaned: number | null;
  survivalToWeaning: number | null;
  groupGainGramsPerDay: number | null;
  groups: number;
}

export const comparisonMetrics = ['adgGramsPerDay', 'ageAtTargetDays', 'feedConversion', 'bornAlive', 'survivalToWeaning', 'dressOutPercent'] as const;
export type ComparisonMetric = (typeof comparisonMetrics)[number];

export interface BreedRow {
  key: string;
  label: string;
  kind: CrossLabel['kind'];
  /** How many litters, groups and processing records the figures rest on. */
  litters: number;
  groups: number;
  processingRecords: number;
  metrics: Record<ComparisonMetric, MetricSummary>;
}

export interface GroupRow {
  id: string;
  name: string;
  formedOn: string;
  status: 'growing' | 'closed';
  heads: number;
  crossKey: string;
  crossLabel: string;
  adgGramsPerDay: number | null;
  ageAtTargetDays: number | null;
  gainGrams: number | null;
  feedGrams: number;
  feedConversion: number | null;
  hotCarcassGrams: number;
  dressOutPercent: number | null;
  /** Money: left out (null) by the presenter for who cannot read it. */
  feedCostCents: number | null;
  costPerKgLive: number | null;
  costPerLbLive: number | null;
  costPerKgCarcass: number | null;
  costPerLbCarcass: number | null;
}

export interface SuggestionRow {
  animal: AnimalRef;
  suggestions: KeepCullSuggestion[];
}

export type PerformanceSource = 'groups' | 'doeLitterFeed' | 'processing';

export interface PerformanceTables {
  period: PerformancePeriod;
  does: DoeRow[];
  bucks: BuckRow[];
  breeds: BreedRow[];
  groups: GroupRow[];
  suggestions: SuggestionRow[];
  /** Sources not available: the figures from them are left out. */
  missing: PerformanceSource[];
}

const inPeriod = (date: string, p: PerformancePeriod) => date >= p.from && date <= p.to;
/** ISO dates and ids compare as plain strings (much cheaper than a locale-aware comparison). */
const byString = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
const sum = <T>(xs: ReadonlyArray<T>, f: (x: T) => number) => xs.reduce((n, x) => n + f(x), 0);
const meanOf = (xs: number[]) => (xs.length > 0 ? xs.reduce((s, v) => s + v, 0) / xs.length : null);
const push = <K, V>(map: Map<K, V[]>, key: K, value: V) => {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
};

function refOf(a: PerformanceAnimal | undefined, id: string): AnimalRef {
  return a ? { id, name: a.name, tattoo: a.tattoo, breedName: a.breedName, onFarm: a.onFarm } : { id, name: 'Unknown animal', tattoo: null, breedName: null, onFarm: false };
}

interface GroupFigures {
  input: PerformanceGroupInput;
  heads: number;
  cross: CrossLabel | null;
  adg: number | null;
  ageAtTargetDays: number | null;
  /** Live weight at the end (processed or last weigh-in), per head; null before any weigh-in. */
  endGramsPerHead: number | null;
  /** Reached the target or was processed: its end weight is a market weight. */
  atMarket: boolean;
  gain: number | null;
  feedConversion: number | null;
  hotCarcass: number;
  live: number;
}

function groupFigures(g: PerformanceGroupInput, records: PerformanceProcessingInput[], cross: CrossLabel | null): GroupFigures {
  const heads = sum(g.litters, (l) => l.heads);
  const weighIns = g.weighIns.filter((w) => w.headCount > 0 && w.totalGrams > 0).sort((a, b) => byString(a.weighedOn, b.weighedOn));
  const adg = weighIns.length >= 2 ? gainSummary(weighIns).gramsPerDay : null;
  const birth = g.litters.length > 0 && heads > 0 ? groupBirthDate(g.litters) : null;
  const reached = weighIns.find((w) => w.totalGrams / w.headCount >= g.targetGrams);
  const ageAtTargetDays = reached && birth ? daysBetween(birth, reached.weighedOn) : null;
  const first = weighIns[0];
  const last = weighIns.at(-1);
  const live = sum(records, (r) => r.liveGrams);
  const hotCarcass = sum(records, (r) => r.hotCarcassGrams);
  let gain: number | null = null;
  let feedConversion: number | null = null;
  let endGramsPerHead: number | null = null;
  if (first && last) {
    const after = records.filter((r) => r.processedOn > last.weighedOn);
    const before = records.filter((r) => r.processedOn <= last.weighedOn);
    const end = after.length > 0 ? sum(after, (r) => r.liveGrams) : last.totalGrams;
    endGramsPerHead = after.length > 0 ? end / Math.max(sum(after, (r) => r.headCount), 1) : last.totalGrams / last.headCount;
    if (weighIns.length >= 2 || after.length > 0) {
      const fc = groupFeedConversion({ feedGrams: g.feedGrams, startTotalGrams: first.totalGrams, endTotalGrams: end, removedLiveGrams: sum(before, (r) => r.liveGrams) });
      gain = fc.gainGrams;
      feedConversion = g.feedGrams > 0 ? fc.ratio : null;
    }
  }
  return {
    input: g, heads, cross, adg, ageAtTargetDays, endGramsPerHead,
    atMarket: Boolean(reached) || records.length > 0, gain, feedConversion, hotCarcass, live,
  };
}

/*
 * A litter's summary depends on its record alone, so it is kept by the record object for as long as the
 * caller keeps that object: a server that hands the same litters again after a change elsewhere (the
 * sources it has not read anew) has them summarized already. Records are read here, never changed.
 */
const performanceLitters = new WeakMap<PerformanceLitterInput, PerformanceLitter>();
const summaries = new WeakMap<LitterRecord, LitterSummary>();

function performanceLitterOf(l: PerformanceLitterInput): PerformanceLitter {
  let p = performanceLitters.get(l);
  if (!p) {
    p = { ...l.record, weaningWeightGrams: l.weaningWeightGrams };
    performanceLitters.set(l, p);
  }
  return p;
}

function summaryOfLitter(record: LitterRecord): LitterSummary {
  let s = summaries.get(record);
  if (!s) {
    s = litterSummary(record);
    summaries.set(record, s);
  }
  return s;
}

/** Every performance table of a farm, over the period (default: all records). */
export function performanceTables(input: PerformanceInput): PerformanceTables {
  const missing: PerformanceSource[] = [];
  if (!input.groups) missing.push('groups');
  if (!input.doeLitterFeed) missing.push('doeLitterFeed');
  if (!input.processing) missing.push('processing');
  // The earliest record: a plain loop, not a sort of every date.
  let earliest: string | undefined;
  for (const s of input.services) if (earliest === undefined || s.servicedOn < earliest) earliest = s.servicedOn;
  for (const l of input.litters) if (earliest === undefined || l.kindledOn < earliest) earliest = l.kindledOn;
  const firstRecord = earliest ?? input.today;
  const period = input.period ?? { from: firstRecord < input.today ? firstRecord : input.today, to: input.today };

  const animals = new Map(input.animals.map((a) => [a.id, a]));
  const litters = new Map(input.litters.map((l) => [l.id, l]));
  const crossCache = new Map<string, CrossLabel>();
  const crossOfLitter = (litterId: string): CrossLabel => {
    let c = crossCache.get(litterId);
    if (!c) {
      const l = litters.get(litterId);
      c = crossLabel(l ? animals.get(l.sireId)?.breedName : null, l ? animals.get(l.damId)?.breedName : null);
      crossCache.set(litterId, c);
    }
    return c;
  };
  // Built only when an animal was processed on its own (most farms process by group).
  let litterByBirth: Map<string, string> | undefined;
  const litterBornOf = (a: { sireId: string; damId: string; birthDate: string }) => {
    litterByBirth ??= new Map(input.litters.map((l) => [`${l.sireId}|${l.damId}|${l.kindledOn}`, l.id]));
    return litterByBirth.get(`${a.sireId}|${a.damId}|${a.birthDate}`);
  };

  // Processing: by group, and carcasses by litter (group records pro rata by heads).
  const groupsInput = input.groups ?? [];
  const groupById = new Map(groupsInput.map((g) => [g.id, g]));
  const recordsByGroup = new Map<string, PerformanceProcessingInput[]>();
  const carcassesByLitter = new Map<string, { processedOn: string; carcassGrams: number }[]>();
  const dressOutUnits: { key: string; values: Partial<Record<ComparisonMetric, number>> }[] = [];
  for (const r of input.processing ?? []) {
    const group = r.groupId ? groupById.get(r.groupId) : undefined;
    if (group) {
      push(recordsByGroup, group.id, r);
      const heads = sum(group.litters, (l) => l.heads);
      for (const l of group.litters) push(carcassesByLitter, l.litterId, { processedOn: r.processedOn, carcassGrams: (r.hotCarcassGrams * l.heads) / heads });
    } else if (r.animalId) {
      const a = input.processedAnimals?.get(r.animalId);
      const litterId = a?.sireId && a.damId && a.birthDate ? litterBornOf({ sireId: a.sireId, damId: a.damId, birthDate: a.birthDate }) : undefined;
      if (litterId) {
        push(carcassesByLitter, litterId, { processedOn: r.processedOn, carcassGrams: r.hotCarcassGrams });
        if (inPeriod(r.processedOn, period) && r.liveGrams > 0) dressOutUnits.push({ key: crossOfLitter(litterId).key, values: { dressOutPercent: dressOutPercent(r.hotCarcassGrams, r.liveGrams) } });
      }
    }
  }

  // Groups: a group's figures are worked out when a table asks for them (a period's tables need the
  // groups formed in it and those its litters grew in, not five years of groups).
  const crossOfGroup = (g: PerformanceGroupInput): CrossLabel | null => {
    let only: CrossLabel | null = null;
    for (const l of g.litters) {
      const c = crossOfLitter(l.litterId);
      if (only && only.key !== c.key) return null;
      only = c;
    }
    return only;
  };
  const figures = new Map<string, GroupFigures>();
  const figuresOf = (g: PerformanceGroupInput): GroupFigures => {
    let f = figures.get(g.id);
    if (!f) {
      f = groupFigures(g, recordsByGroup.get(g.id) ?? [], crossOfGroup(g));
      figures.set(g.id, f);
    }
    return f;
  };
  const groupsInPeriod = groupsInput.filter((g) => inPeriod(g.formedOn, period)).map(figuresOf);
  const groupsOfLitter = new Map<string, { group: PerformanceGroupInput; heads: number }[]>();
  for (const g of groupsInput) for (const l of g.litters) push(groupsOfLitter, l.litterId, { group: g, heads: l.heads });

  // Per doe and per buck: records by animal.
  const servicesByDoe = new Map<string, PerformanceServiceInput[]>();
  const servicesByBuck = new Map<string, PerformanceServiceInput[]>();
  for (const s of input.services) {
    push(servicesByDoe, s.doeId, s);
    push(servicesByBuck, s.buckId, s);
  }
  // Each litter is checked and summarized once, for its doe and its buck alike (and, when the caller hands
  // the same litter objects again, once across calls: see `summaries`).
  const performanceLitters = new Map(input.litters.map((l) => [l.id, performanceLitterOf(l)]));
  const littersByDam = new Map<string, PerformanceLitterInput[]>();
  const littersBySire = new Map<string, PerformanceLitterInput[]>();
  for (const l of input.litters) {
    push(littersByDam, l.damId, l);
    push(littersBySire, l.sireId, l);
  }
  const active = (services: PerformanceServiceInput[] | undefined, ls: PerformanceLitterInput[] | undefined) =>
    (services ?? []).some((s) => inPeriod(s.servicedOn, period)) || (ls ?? []).some((l) => inPeriod(l.kindledOn, period));

  const groupGain = (ls: PerformanceLitterInput[]) => {
    const seen = new Map<string, GroupFigures>();
    for (const l of ls) {
      for (const { group } of groupsOfLitter.get(l.id) ?? []) {
        const fig = figuresOf(group);
        if (fig.adg !== null) seen.set(group.id, fig);
      }
    }
    return [...seen.values()];
  };

  const does: DoeRow[] = [];
  const suggestions: SuggestionRow[] = [];
  const doeIds = new Set([...servicesByDoe.keys(), ...littersByDam.keys()]);
  for (const doeId of doeIds) {
    const services = servicesByDoe.get(doeId) ?? [];
    const own = littersByDam.get(doeId) ?? [];
    if (!active(services, own)) continue;
    const carcasses = input.processing ? own.flatMap((l) => carcassesByLitter.get(l.id) ?? []) : undefined;
    const perf: DoePerformance = doePerformance(
      { services, litters: own.map((l) => performanceLitters.get(l.id)!), carcasses },
      period,
      summaryOfLitter,
    );
    const inP = own.filter((l) => inPeriod(l.kindledOn, period));
    let toWeaning: number | null = null;
    let toMarket: number | null = null;
    if (input.doeLitterFeed) {
      const weighed = inP.filter((l) => l.weaningWeightGrams && input.doeLitterFeed!.has(l.id));
      if (weighed.length > 0) {
        toWeaning = doeLitterFeedConversion({ feedGrams: sum(weighed, (l) => input.doeLitterFeed!.get(l.id)!.grams), youngLiveGrams: sum(weighed, (l) => l.weaningWeightGrams!) }).ratio;
      }
      if (input.groups) {
        let feed = 0;
        let young = 0;
        for (const l of inP) {
          const doeFeed = input.doeLitterFeed.get(l.id);
          const placed = (groupsOfLitter.get(l.id) ?? []).map(({ group, heads }) => ({ fig: figuresOf(group), heads }));
          if (!doeFeed || placed.length === 0 || !placed.every(({ fig }) => fig.atMarket && fig.endGramsPerHead !== null && fig.heads > 0)) continue;
          feed += doeFeed.grams + sum(placed, ({ fig, heads }) => (fig.input.feedGrams * heads) / fig.heads);
          young += sum(placed, ({ fig, heads }) => fig.endGramsPerHead! * heads);
        }
        if (young > 0) toMarket = doeLitterFeedConversion({ feedGrams: feed, youngLiveGrams: young }).ratio;
      }
    }
    const gains = groupGain(inP);
    const ref = refOf(animals.get(doeId), doeId);
    does.push({
      animal: ref,
      services: perf.services,
      conceptionRate: perf.conceptionRate,
      missedInARow: perf.missedInARow,
      litters: perf.litters,
      littersPerYear: perf.littersPerYear,
      kindlingIntervalDays: perf.kindlingIntervalDays,
      averageBornAlive: perf.averageBornAlive,
      averageWeaned: perf.averageWeaned,
      survivalToWeaning: perf.survivalToWeaning,
      averageLitterWeaningGrams: perf.averageLitterWeaningGrams,
      kitsWeanedPerYear: perf.kitsWeanedPerYear,
      daysInService: perf.days,
      carcassGramsPerYear: perf.carcassGramsPerYear,
      feedConversionToWeaning: toWeaning,
      feedConversionToMarket: toMarket,
      litterGainGramsPerDay: input.groups ? meanOf(gains.map((g) => g.adg!)) : null,
      groups: gains.length,
    });
    if (ref.onFarm) {
      suggestions.push({ animal: ref, suggestions: keepCullSuggestions(perf, input.groups ? { litterGainsGramsPerDay: gains.map((g) => g.adg!) } : null) });
    }
  }

  const bucks: BuckRow[] = [];
  const buckIds = new Set([...servicesByBuck.keys(), ...littersBySire.keys()]);
  for (const buckId of buckIds) {
    const services = servicesByBuck.get(buckId) ?? [];
    const sired = littersBySire.get(buckId) ?? [];
    if (!active(services, sired)) continue;
    const perf = buckPerformance({ services, litters: sired.map((l) => performanceLitters.get(l.id)!) }, period, summaryOfLitter);
    const gains = groupGain(sired.filter((l) => inPeriod(l.kindledOn, period)));
    bucks.push({
      animal: refOf(animals.get(buckId), buckId),
      ...perf,
      groupGainGramsPerDay: input.groups ? meanOf(gains.map((g) => g.adg!)) : null,
      groups: gains.length,
    });
  }

  // Breeds and crosses: litters, groups of one cross, processing records, each a unit of its own.
  const units: { key: string; kind: 'litter' | 'group' | 'processing'; values: Partial<Record<ComparisonMetric, number>> }[] = [];
  for (const l of input.litters) {
    if (!inPeriod(l.kindledOn, period)) continue;
    const s = l.record;
    const raised = s.bornAlive + sum(s.events, (e) => (e.kind === 'fostered_in' ? e.count : e.kind === 'fostered_out' ? -e.count : 0));
    const leaving = sum(s.events, (e) => (e.kind === 'fostered_in' || e.kind === 'fostered_out' ? 0 : e.count));
    const weaned = sum(s.events, (e) => (e.kind === 'weaned' ? e.count : 0));
    units.push({ key: crossOfLitter(l.id).key, kind: 'litter', values: { bornAlive: s.bornAlive, ...(raised > 0 && leaving === raised ? { survivalToWeaning: weaned / raised } : {}) } });
  }
  for (const f of groupsInPeriod) {
    if (!f.cross) continue;
    const values: Partial<Record<ComparisonMetric, number>> = {};
    if (f.adg !== null) values.adgGramsPerDay = f.adg;
    if (f.ageAtTargetDays !== null) values.ageAtTargetDays = f.ageAtTargetDays;
    if (f.feedConversion !== null) values.feedConversion = f.feedConversion;
    units.push({ key: f.cross.key, kind: 'group', values });
  }
  for (const g of groupsInput) {
    const records = recordsByGroup.get(g.id);
    const cross = records ? crossOfGroup(g) : null;
    if (!records || !cross) continue;
    for (const r of records) {
      if (inPeriod(r.processedOn, period) && r.liveGrams > 0) units.push({ key: cross.key, kind: 'processing', values: { dressOutPercent: dressOutPercent(r.hotCarcassGrams, r.liveGrams) } });
    }
  }
  for (const u of dressOutUnits) units.push({ ...u, kind: 'processing' });
  const labels = new Map<string, CrossLabel>();
  for (const id of litters.keys()) labels.set(crossOfLitter(id).key, crossOfLitter(id));
  const counts = new Map<string, { litters: number; groups: number; processingRecords: number }>();
  for (const u of units) {
    const c = counts.get(u.key) ?? { litters: 0, groups: 0, processingRecords: 0 };
    if (u.kind === 'litter') c.litters++;
    else if (u.kind === 'group') c.groups++;
    else c.processingRecords++;
    counts.set(u.key, c);
  }
  const breeds: BreedRow[] = compareByKey(units, comparisonMetrics).map((row) => {
    const label = labels.get(row.key) ?? { key: row.key, label: row.key, kind: 'unknown' as const };
    return { key: row.key, label: label.label, kind: label.kind, ...counts.get(row.key)!, metrics: row.metrics };
  });

  const groups: GroupRow[] = groupsInPeriod
    .map((f) => {
      const cost = feedCostPerWeight({ feedCostCents: f.input.feedCostCents, liveGrams: f.gain, carcassGrams: f.hotCarcass });
      return {
        id: f.input.id,
        name: f.input.name,
        formedOn: f.input.formedOn,
        status: f.input.status,
        heads: f.heads,
        crossKey: f.cross?.key ?? 'mixed',
        crossLabel: f.cross?.label ?? 'Mixed litters',
        adgGramsPerDay: f.adg,
        ageAtTargetDays: f.ageAtTargetDays,
        gainGrams: f.gain,
        feedGrams: f.input.feedGrams,
        feedConversion: f.feedConversion,
        hotCarcassGrams: f.hotCarcass,
        dressOutPercent: f.live > 0 ? dressOutPercent(f.hotCarcass, f.live) : null,
        feedCostCents: f.input.feedCostCents,
        costPerKgLive: cost.perKgLive,
        costPerLbLive: cost.perLbLive,
        costPerKgCarcass: cost.perKgCarcass,
        costPerLbCarcass: cost.perLbCarcass,
      };
    })
    .sort((a, b) => byString(b.formedOn, a.formedOn) || byString(a.name, b.name));

  const byName = (a: { animal: AnimalRef }, b: { animal: AnimalRef }) => a.animal.name.localeCompare(b.animal.name) || (a.animal.tattoo ?? '').localeCompare(b.animal.tattoo ?? '');
  const rank = { consider_culling: 0, watch: 1, keep: 2, too_early: 3 } as const;
  return {
    period,
    does: does.sort(byName),
    bucks: bucks.sort(byName),
    breeds,
    groups,
    suggestions: suggestions.sort((a, b) => rank[a.suggestions[0]!.action] - rank[b.suggestions[0]!.action] || byName(a, b)),
    missing,
  };
}

/** The last 12 months to today: the default period of the performance screen. */
export function lastTwelveMonths(today: string): PerformancePeriod {
  return { from: addDays(today, -364), to: today };
}
