import {
  checkWeightForAge, daysBetween, feedCostPerWeight, gainSummary, gompertzWeight, groupFeedConversion, projectionModelName, projectTargetDate, PUBLISHED_FEED_CONVERSION, PUBLISHED_GAIN, weighInSchedule, type GrowOutGroupDto, type GrowOutGroupListItemDto, type GrowthProjection, type SizeClass, type WeighInPoint,
} from '@burrowline/shared';
import type { GroupWeighInRow } from '../animals/group-weigh-ins.service';
import type { AnimalFacts } from '../animals/animal-facts.service';
import type { LitterFacts } from '../litters/litter-facts.service';
import type { GrowOutGroup } from './grow-out-group.model';


/** A group with what presenting it needs: its litters, heads, birth date, cross and weigh-ins. */
export interface GroupInfo {
  group: GrowOutGroup;
  members: { litterId: string; heads: number; litter: LitterFacts }[];
  heads: number;
  birthDate: string;
  sizeClass: SizeClass;
  cross: { key: string; label: string; kind: 'purebred' | 'cross' | 'unknown' };
  /** Weigh-ins that count (accepted), oldest first; `all` keeps pending ones too. */
  accepted: GroupWeighInRow[];
  all: GroupWeighInRow[];
  /** Heads processed from the group, oldest first. */
  processed: { processedOn: string; headCount: number }[];
}

/**
 * The one count of a group's heads on a date, for every screen, form and figure: the head count of its
 * latest accepted weigh-in by then (or the heads it was formed with), less the heads processed since that
 * weigh-in (on its day or after) up to the date.
 */
export function groupHeadsOn(
  group: { formedHeads: number; weighIns: readonly { weighedOn: string; headCount: number }[]; processed: readonly { processedOn: string; headCount: number }[] },
  date: string,
): number {
  const weighIn = group.weighIns.filter((w) => w.weighedOn <= date).at(-1);
  const base = weighIn ? weighIn.headCount : group.formedHeads;
  const since = group.processed.filter((p) => p.processedOn <= date && (!weighIn || p.processedOn >= weighIn.weighedOn));
  return Math.max(0, base - since.reduce((n, p) => n + p.headCount, 0));
}

/** Heads of a group on a date, as `groupHeadsOn` counts them. */
export function headsLeftOn(info: GroupInfo, date: string): number {
  return groupHeadsOn({ formedHeads: info.heads, weighIns: info.accepted, processed: info.processed }, date);
}

const points = (rows: GroupWeighInRow[]): WeighInPoint[] => rows.map((w) => ({ weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount }));

export function projectionOf(info: GroupInfo): GrowthProjection {
  return projectTargetDate({ birthDate: info.birthDate, weighIns: points(info.accepted), targetGrams: info.group.targetGrams, sizeClass: info.sizeClass });
}

export function listItemOf(info: GroupInfo, today: string): GrowOutGroupListItemDto {
  const g = info.group;
  const projection = projectionOf(info);
  const gain = gainSummary(points(info.accepted));
  const last = info.accepted.at(-1);
  return {
    id: g.id, farmId: g.farmId, name: g.name, formedOn: g.formedOn, status: g.status, closedOn: g.closedOn,
    heads: info.heads, currentHeads: headsLeftOn(info, g.closedOn ?? today), birthDate: info.birthDate,
    ageDays: daysBetween(info.birthDate, g.closedOn ?? today), targetGrams: g.targetGrams, crossLabel: info.cross.label,
    latest: last ? { weighedOn: last.weighedOn, gramsPerHead: Math.round(last.totalGrams / last.headCount) } : null,
    gramsPerDay: gain.gramsPerDay,
    projection: { status: projection.status, projectedOn: projection.status === 'reached' ? projection.reachedOn : projection.projectedOn, interval: projection.interval, modelKind: projection.model.kind, message: projection.message },
    pendingWeighIns: info.all.filter((w) => w.reviewState === 'pending').length,
    version: g.version,
  };
}

/** Fryers gain about 30–40 g a day; over 100 g a head a day (and 300 g in all, beyond gut fill) since the last weigh-in asks for a check (common practice). */
const SUSPECT_GAIN_GRAMS_PER_DAY = 100;

function cautionOf(w: GroupWeighInRow, info: GroupInfo): string | null {
  const perHead = w.totalGrams / w.headCount;
  const check = checkWeightForAge(perHead, daysBetween(info.birthDate, w.weighedOn), info.sizeClass);
  if (check?.level === 'warning') return check.message;
  const previous = [...info.accepted].reverse().find((p) => p.weighedOn < w.weighedOn);
  if (previous) {
    const rise = perHead - previous.totalGrams / previous.headCount;
    const days = daysBetween(previous.weighedOn, w.weighedOn);
    if (rise > 300 && rise / days > SUSPECT_GAIN_GRAMS_PER_DAY) {
      return `${Math.round(rise / days)} g a head a day since ${previous.weighedOn} is far above the usual 30–40 g; check the weight and the head count`;
    }
  }
  return null;
}

/** The ages (days) the detail's chart shows the co-op's average at. */
export function chartAgesOf(info: GroupInfo): number[] {
  const groupSeries = gainPoints(info);
  const lastAge = groupSeries.at(-1)?.ageDays ?? 56;
  const endAge = Math.max(84, Math.ceil((projectionOf(info).projectedAgeDays ?? lastAge) + 7), lastAge + 7);
  const ages: number[] = [];
  for (let a = 28; a <= endAge; a += 7) ages.push(a);
  return ages;
}

/** What the service loads for a group's detail. */
export interface GroupDetailSources {
  today: string;
  parents: Map<string, AnimalFacts>;
  crossOf: (l: LitterFacts) => GroupInfo['cross'];
  names: Map<string, string>;
  units: Map<string, string>;
  coopAverage: { ageDays: number; gramsPerHead: number | null; heads: number; weighIns: number }[];
  feed: { grams: number; costCents: number };
  weighInAgesDays: readonly number[];
  canSeeMoney: boolean;
  canEdit: boolean;
}

/** A group's full record: litters, weigh-ins with cautions, gain, projection, chart and feed. */
export function presentGroupDetail(info: GroupInfo, loaded: GroupDetailSources): GrowOutGroupDto {
  const group = info.group;
  const today = loaded.today;
  const money = loaded.canSeeMoney;
  const names = loaded.names;
  const units = loaded.units;
  const base = listItemOf(info, today);
  const projection = projectionOf(info);

  // Per-kit gain: kits weighed one by one and labelled, followed across weigh-ins.
  const byLabel = new Map<string, WeighInPoint[]>();
  for (const w of info.accepted) {
    for (const k of w.kitWeights ?? []) {
      if (!k.label) continue;
      const key = k.label;
      byLabel.set(key, [...(byLabel.get(key) ?? []), { weighedOn: w.weighedOn, totalGrams: k.grams, headCount: 1 }]);
    }
  }
  const kitGains = [...byLabel.entries()].sort(([a], [b]) => a.localeCompare(b, 'en', { numeric: true })).map(([label, pts]) => ({
    label, weighIns: pts.length, latestGrams: pts.at(-1)!.totalGrams, gramsPerDay: gainSummary(pts).gramsPerDay,
  }));

  // The chart: the group, the co-op's average for its cross, the published line, the model's curve.
  const groupSeries = gainPoints(info);
  const lastAge = groupSeries.at(-1)?.ageDays ?? 56;
  const coop = loaded.coopAverage.map((r) => ({ ageDays: r.ageDays, grams: r.gramsPerHead === null ? null : Math.round(r.gramsPerHead), heads: r.heads, groups: r.weighIns }));
  const publishedStart = PUBLISHED_GAIN.eightWeekGrams - PUBLISHED_GAIN.gramsPerDay * PUBLISHED_GAIN.toAgeDays;
  const projectionSeries: { ageDays: number; grams: number }[] = [];
  const firstAge = groupSeries[0]?.ageDays;
  if (firstAge !== undefined && projection.status === 'projected') {
    const until = Math.ceil(projection.projectedAgeDays ?? lastAge) + 3;
    for (let a = firstAge; a <= until; a += 2) {
      const m = projection.model;
      const grams = m.gompertz ? gompertzWeight(a, m.gompertz) : m.line ? m.line.interceptGrams + m.line.gramsPerDay * a : null;
      if (grams !== null) projectionSeries.push({ ageDays: a, grams: Math.round(grams) });
    }
  }

  // Feed: the group's own feed and its share of pen- and farm-wide feed.
  const feed = loaded.feed;
  const first = info.accepted[0];
  const last = info.accepted.at(-1);
  const conversion = first && last && first.weighedOn !== last.weighedOn
    ? groupFeedConversion({ feedGrams: feed.grams, startTotalGrams: first.totalGrams, endTotalGrams: last.totalGrams })
    : null;
  const cost = money && feed.grams > 0 ? feedCostPerWeight({ feedCostCents: feed.costCents, liveGrams: conversion && conversion.gainGrams > 0 ? conversion.gainGrams : null }) : null;
  const model = projectionModelName(projection);
  const schedule = weighInSchedule({
    birthDate: info.birthDate, agesDays: loaded.weighInAgesDays, formedOn: group.formedOn,
    closedOn: group.closedOn, weighedOn: info.all.map((w) => w.weighedOn), today,
  });

  return {
    ...base,
    housingUnit: group.housingUnitId ? { id: group.housingUnitId, name: units.get(group.housingUnitId) ?? 'A pen' } : null,
    notes: group.notes,
    litters: info.members.map((m) => ({
      litterId: m.litterId, heads: m.heads, kindledOn: m.litter.kindledOn,
      dam: { id: m.litter.damId, name: loaded.parents.get(m.litter.damId)?.name ?? 'Unknown doe' },
      sire: { id: m.litter.sireId, name: loaded.parents.get(m.litter.sireId)?.name ?? 'Unknown buck' },
      cross: loaded.crossOf(m.litter),
    })),
    weighIns: info.all.map((w) => ({
      id: w.id, weighedOn: w.weighedOn, ageDays: daysBetween(info.birthDate, w.weighedOn), totalGrams: w.totalGrams, headCount: w.headCount,
      gramsPerHead: Math.round(w.totalGrams / w.headCount), kits: w.kitWeights, note: w.note,
      enteredBy: { id: w.enteredBy, name: names.get(w.enteredBy) ?? 'Someone' }, reviewState: w.reviewState, caution: cautionOf(w, info), version: w.version,
    })),
    weighInSchedule: schedule,
    gain: gainSummary(points(info.accepted)),
    kitGains,
    projection: { ...projection, modelName: model.name, why: model.why },
    chart: {
      group: groupSeries, coop, coopLabel: info.cross.label,
      published: [{ ageDays: 0, grams: Math.round(publishedStart * 10) / 10 }, { ageDays: PUBLISHED_GAIN.toAgeDays, grams: PUBLISHED_GAIN.eightWeekGrams }],
      publishedSource: PUBLISHED_GAIN.source, projection: projectionSeries, targetGrams: group.targetGrams,
    },
    feed: {
      // No feed recorded yet is an unknown conversion, not a free one.
      feedGrams: feed.grams, gainGrams: conversion?.gainGrams ?? null, conversion: feed.grams > 0 ? (conversion?.ratio ?? null) : null,
      feedCostCents: money ? feed.costCents : null, costPerKgLiveCents: cost?.perKgLive ?? null, costPerLbLiveCents: cost?.perLbLive ?? null,
      publishedConversion: PUBLISHED_FEED_CONVERSION.growOutPellets,
    },
    canEdit: loaded.canEdit,
    canSeeMoney: money,
  };
}


function gainPoints(info: GroupInfo): { ageDays: number; grams: number; weighedOn: string }[] {
  const byDay = new Map<string, { grams: number; heads: number }>();
  for (const w of info.accepted) {
    const d = byDay.get(w.weighedOn) ?? { grams: 0, heads: 0 };
    d.grams += w.totalGrams;
    d.heads += w.headCount;
    byDay.set(w.weighedOn, d);
  }
  return [...byDay.entries()].map(([on, d]) => ({ weighedOn: on, ageDays: daysBetween(info.birthDate, on), grams: Math.round(d.grams / d.heads) }));
}

