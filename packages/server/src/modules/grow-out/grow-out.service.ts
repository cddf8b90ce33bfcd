import { Op, type Transaction } from 'sequelize';
import {
  addDays, averageWeightByAge, checkWeightForAge, crossLabel, daysBetween, defineAbilityFor,
  EARLIEST_GROW_OUT_AGE_DAYS, ErrorCode, feedCostPerWeight, gainSummary, gompertzWeight, groupBirthDate, groupFeedConversion,
  projectionModelName, projectTargetDate, PUBLISHED_FEED_CONVERSION, PUBLISHED_GAIN, readinessWords, readyBy, RealtimeEvent, weighInSchedule,
  referenceCurve, rooms, subjectOf, todayIn, type Action, type GroupWeighInCreateInput, type GrowOutGroupCloseInput,
  type GrowOutGroupCreateInput, type GrowOutGroupDto, type GrowOutGroupListItemDto, type GrowOutListDto, type GrowOutListQuery,
  type GrowthProjection, type LitterChoiceDto, type SizeClass, type SubjectName, type WeighInPoint,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../http/passport';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { settingsOf } from '../almanac/cycle-settings.service';
import { completeWeighInTasksOf } from '../almanac/tasks.service';
import { animalFactsOf } from '../animals/animals.service';
import { groupWeighInsOf, insertGroupWeighIn, weighInOwnerOf, type GroupWeighInRow } from '../animals/group-weigh-ins.service';
import { breedMapOf } from '../breeds/breeds.service';
import { farmDirectoryOf } from '../farms/farms.service';
import { feedTotalsByGroup } from '../feed/feed-totals.service';
import { farmLitterFactsOf, housingUnitNamesOf, housingUnitOfFarm, litterFactsOf, type LitterFacts } from '../litters/litter-facts.service';
import { namesOf } from '../users/users.service';
import { GrowOutGroup, GrowOutGroupLitter } from './grow-out-group.model';
import { groupBy } from '../../lib/group-by';
import { lockUntilCommit } from '../../db/advisory-lock';

// ---------------------------------------------------------------------------------------------------
// Contracts for feed, health, processing and performance (issue 7 plan).

export interface GrowOutFacts {
  id: string; farmId: string; name: string; formedOn: string; status: 'growing' | 'closed'; closedOn: string | null;
  targetGrams: number;
  litters: { litterId: string; heads: number; damId: string; sireId: string; kindledOn: string }[];
  /** Accepted group weigh-ins, oldest first. */
  weighIns: { weighedOn: string; totalGrams: number; headCount: number }[];
  /** Feed given to the group, including its allocated share of pen- and farm-wide feed (grams, cents). */
  feedGrams: number; feedCostCents: number;
}

/**
 * Every grow-out group of a farm (or only the groups asked for) with its make-up, accepted weigh-ins and
 * feed, oldest first. Working out the feed book is the costly part: callers that need no feed (saving a
 * processing record) leave it out and get zeros.
 */
export async function growOutFactsOfFarm(
  tx: Transaction, coopId: string, farmId: string, opts: { groupIds?: string[]; withFeed?: boolean } = {},
): Promise<GrowOutFacts[]> {
  const groups = await GrowOutGroup.findAll({
    where: { coopId, farmId, ...(opts.groupIds ? { id: { [Op.in]: opts.groupIds } } : {}) },
    order: [['formedOn', 'ASC'], ['createdAt', 'ASC']],
    transaction: tx,
  });
  const members = await membersOf(tx, groups.map((g) => g.id));
  const litters = await litterFactsOf(tx, coopId, members.map((m) => m.litterId));
  const weighIns = await groupWeighInsOf(tx, coopId, groups.map((g) => g.id), { acceptedOnly: true });
  const feed = opts.withFeed === false ? new Map<string, { grams: number; costCents: number }>() : await feedTotalsByGroup(tx, coopId, farmId);
  const membersByGroup = groupBy(members, (m) => m.groupId);
  const weighInsByGroup = groupBy(weighIns, (w) => w.groupId);
  return groups.map((g) => ({
    id: g.id, farmId: g.farmId, name: g.name, formedOn: g.formedOn, status: g.status, closedOn: g.closedOn, targetGrams: g.targetGrams,
    litters: (membersByGroup.get(g.id) ?? []).map((m) => {
      const l = litters.get(m.litterId)!;
      return { litterId: m.litterId, heads: m.heads, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn };
    }),
    weighIns: (weighInsByGroup.get(g.id) ?? []).map((w) => ({ weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount })),
    feedGrams: feed.get(g.id)?.grams ?? 0,
    feedCostCents: feed.get(g.id)?.costCents ?? 0,
  }));
}

/** A farm's groups for pickers (treatments, processing, feed), growing first. */
export async function groupsOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<{ id: string; name: string; status: 'growing' | 'closed'; litterIds: string[] }[]> {
  const groups = await GrowOutGroup.findAll({ where: { coopId, farmId }, order: [['status', 'DESC'], ['formedOn', 'DESC']], transaction: tx });
  const members = await membersOf(tx, groups.map((g) => g.id));
  return groups.map((g) => ({ id: g.id, name: g.name, status: g.status, litterIds: members.filter((m) => m.groupId === g.id).map((m) => m.litterId) }));
}

/** Kits of each litter of a farm taken into groups, with the day they left the doe (the forming date). */
export async function kitsInGroupsByLitter(tx: Transaction, coopId: string, farmId: string): Promise<Map<string, { on: string; heads: number }[]>> {
  const groups = await GrowOutGroup.findAll({ where: { coopId, farmId }, attributes: ['id', 'formedOn'], transaction: tx });
  const formed = new Map(groups.map((g) => [g.id, g.formedOn]));
  const result = new Map<string, { on: string; heads: number }[]>();
  for (const m of await membersOf(tx, groups.map((g) => g.id))) {
    result.set(m.litterId, [...(result.get(m.litterId) ?? []), { on: formed.get(m.groupId)!, heads: m.heads }]);
  }
  return result;
}

/** One group of a farm (for feed given to it), or null when it is not the farm's. */
export async function groupOfFarm(tx: Transaction, coopId: string, farmId: string, groupId: string) {
  const g = await GrowOutGroup.findOne({ where: { id: groupId, coopId, farmId }, transaction: tx });
  return g ? { id: g.id, name: g.name, status: g.status, formedOn: g.formedOn, closedOn: g.closedOn, housingUnitId: g.housingUnitId } : null;
}

/**
 * The groups on a farm (or in one pen) at some time in a period, with their head-days in it and their
 * live weight at its end: the shares pen- and farm-wide feed is split by. Heads follow the weigh-ins'
 * head counts; before the first weigh-in the live weight is the reference curve's for the age.
 */
export async function groupsPresentDuring(
  tx: Transaction, coopId: string, farmId: string, from: string, to: string, unitId?: string,
): Promise<{ id: string; name: string; headDays: number; liveGrams: number }[]> {
  const groups = await GrowOutGroup.findAll({
    where: {
      coopId, farmId, formedOn: { [Op.lte]: to }, ...(unitId ? { housingUnitId: unitId } : {}),
      [Op.or]: [{ closedOn: { [Op.is]: null } }, { closedOn: { [Op.gte]: from } }],
    },
    transaction: tx,
  });
  if (groups.length === 0) return [];
  const ctx = await contextOf(tx, coopId, groups);
  return groups.map((g) => {
    const info = ctx.info(g);
    const start = from > g.formedOn ? from : g.formedOn;
    const end = g.closedOn && g.closedOn < to ? g.closedOn : to;
    let headDaysTotal = 0;
    for (let day = start; day <= end; day = addDays(day, 1)) headDaysTotal += headsOn(info, day);
    const latest = [...info.accepted].reverse().find((w) => w.weighedOn <= to);
    const liveGrams = latest
      ? (latest.totalGrams / latest.headCount) * headsOn(info, to)
      : gompertzWeight(Math.max(daysBetween(info.birthDate, to), 0), referenceCurve(info.sizeClass)) * headsOn(info, to);
    return { id: g.id, name: g.name, headDays: headDaysTotal, liveGrams: Math.round(liveGrams) };
  }).filter((g) => g.headDays > 0);
}

// ---------------------------------------------------------------------------------------------------
// Access

function farmOf(actor: SessionUser): string {
  if (!actor.farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm keeps grow-out groups');
  return actor.farmId;
}

/** Another farm's (or co-op's) group does not exist for the actor (404); on their own farm a refusal is 403. */
function ensureCan(actor: SessionUser, action: Action, subjectName: SubjectName, fields: Record<string, unknown>, what: string, refusal: string): void {
  const ability = defineAbilityFor(actor);
  if (ability.can(action, subjectOf(subjectName, { coopId: actor.coopId, ...fields }))) return;
  if (fields.farmId !== actor.farmId) throw AppError.notFound(what);
  throw new AppError(ErrorCode.forbidden, 403, refusal);
}

export function canSeeMoney(actor: SessionUser, farmId: string): boolean {
  return defineAbilityFor(actor).can('read', subjectOf('Money', { coopId: actor.coopId, farmId }));
}

async function farmToday(tx: Transaction, coopId: string, farmId: string): Promise<string> {
  const farm = (await farmDirectoryOf(coopId, tx)).get(farmId);
  return todayIn(farm?.timeZone || 'America/Chicago');
}

/** Grow-out writes of one farm run one at a time, so two groups never take the same kits. */
async function lockFarm(tx: Transaction, farmId: string): Promise<void> {
  await lockUntilCommit(tx, `grow-out:${farmId}`);
}

async function groupFor(tx: Transaction, actor: SessionUser, groupId: string, lock = false): Promise<GrowOutGroup> {
  const group = await GrowOutGroup.findOne({ where: { id: groupId, coopId: actor.coopId }, transaction: tx, lock: lock ? tx.LOCK.UPDATE : undefined });
  if (!group || group.farmId !== actor.farmId) throw AppError.notFound('That group');
  ensureCan(actor, 'read', 'GrowOutGroup', { farmId: group.farmId }, 'That group', 'You may not see that group');
  return group;
}

function announce(tx: Transaction, farmId: string, groupId: string | null): void {
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.growOutChanged, { farmId, groupId }));
}

// ---------------------------------------------------------------------------------------------------
// Reading groups

async function membersOf(tx: Transaction, groupIds: string[]): Promise<GrowOutGroupLitter[]> {
  if (groupIds.length === 0) return [];
  return GrowOutGroupLitter.findAll({ where: { groupId: { [Op.in]: groupIds } }, transaction: tx, raw: true });
}

interface GroupInfo {
  group: GrowOutGroup;
  members: { litterId: string; heads: number; litter: LitterFacts }[];
  heads: number;
  birthDate: string;
  sizeClass: SizeClass;
  cross: { key: string; label: string; kind: 'purebred' | 'cross' | 'unknown' };
  /** Weigh-ins that count (accepted), oldest first; `all` keeps pending ones too. */
  accepted: GroupWeighInRow[];
  all: GroupWeighInRow[];
}

function headsOn(info: GroupInfo, date: string): number {
  if (date < info.group.formedOn || (info.group.closedOn && date > info.group.closedOn)) return 0;
  const latest = [...info.accepted].reverse().find((w) => w.weighedOn <= date);
  return latest ? latest.headCount : info.heads;
}

/** Everything presenting a set of groups needs, fetched once. */
async function contextOf(tx: Transaction, coopId: string, groups: GrowOutGroup[]) {
  const members = await membersOf(tx, groups.map((g) => g.id));
  const litters = await litterFactsOf(tx, coopId, members.map((m) => m.litterId));
  const parents = await animalFactsOf(tx, coopId, [...litters.values()].flatMap((l) => [l.damId, l.sireId]));
  const breeds = await breedMapOf(coopId, tx);
  const weighIns = await groupWeighInsOf(tx, coopId, groups.map((g) => g.id));
  const crossOf = (l: LitterFacts) => crossLabel(parents.get(l.sireId)?.lineBreedName, parents.get(l.damId)?.lineBreedName);
  const cache = new Map<string, GroupInfo>();
  const info = (group: GrowOutGroup): GroupInfo => {
    const hit = cache.get(group.id);
    if (hit) return hit;
    const own = members.filter((m) => m.groupId === group.id).map((m) => ({ litterId: m.litterId, heads: m.heads, litter: litters.get(m.litterId)! }));
    const main = [...own].sort((a, b) => b.heads - a.heads)[0];
    const sireBreed = main ? parents.get(main.litter.sireId)?.breedId : null;
    const damBreed = main ? parents.get(main.litter.damId)?.breedId : null;
    const sizeClass = (sireBreed && breeds.get(sireBreed)?.sizeClass) || (damBreed && breeds.get(damBreed)?.sizeClass) || 'medium';
    const all = weighIns.filter((w) => w.groupId === group.id);
    const result: GroupInfo = {
      group, members: own, heads: own.reduce((n, m) => n + m.heads, 0),
      birthDate: own.length > 0 ? groupBirthDate(own.map((m) => ({ kindledOn: m.litter.kindledOn, heads: m.heads }))) : group.formedOn,
      sizeClass, cross: main ? crossOf(main.litter) : crossLabel(null, null),
      accepted: all.filter((w) => w.reviewState === 'accepted'), all,
    };
    cache.set(group.id, result);
    return result;
  };
  return { info, parents, crossOf };
}

const points = (rows: GroupWeighInRow[]): WeighInPoint[] => rows.map((w) => ({ weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount }));

function projectionOf(info: GroupInfo): GrowthProjection {
  return projectTargetDate({ birthDate: info.birthDate, weighIns: points(info.accepted), targetGrams: info.group.targetGrams, sizeClass: info.sizeClass });
}

function listItemOf(info: GroupInfo, today: string): GrowOutGroupListItemDto {
  const g = info.group;
  const projection = projectionOf(info);
  const gain = gainSummary(points(info.accepted));
  const last = info.accepted.at(-1);
  return {
    id: g.id, farmId: g.farmId, name: g.name, formedOn: g.formedOn, status: g.status, closedOn: g.closedOn,
    heads: info.heads, currentHeads: last ? last.headCount : info.heads, birthDate: info.birthDate,
    ageDays: daysBetween(info.birthDate, g.closedOn ?? today), targetGrams: g.targetGrams, crossLabel: info.cross.label,
    latest: last ? { weighedOn: last.weighedOn, gramsPerHead: Math.round(last.totalGrams / last.headCount) } : null,
    gramsPerDay: gain.gramsPerDay,
    projection: { status: projection.status, projectedOn: projection.status === 'reached' ? projection.reachedOn : projection.projectedOn, interval: projection.interval, modelKind: projection.model.kind, message: projection.message },
    pendingWeighIns: info.all.filter((w) => w.reviewState === 'pending').length,
    version: g.version,
  };
}

/** The co-op's mean weight by age for groups of one breed or cross, from every farm's groups: aggregates only. */
async function coopAverageFor(tx: Transaction, coopId: string, crossKey: string, ages: number[]) {
  const groups = await GrowOutGroup.findAll({ where: { coopId }, transaction: tx });
  const ctx = await contextOf(tx, coopId, groups);
  const rows: { ageDays: number; totalGrams: number; headCount: number }[] = [];
  for (const g of groups) {
    const info = ctx.info(g);
    if (info.cross.key !== crossKey || info.members.length === 0) continue;
    for (const w of info.accepted) rows.push({ ageDays: daysBetween(info.birthDate, w.weighedOn), totalGrams: w.totalGrams, headCount: w.headCount });
  }
  return averageWeightByAge(rows, ages);
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

async function detailOf(tx: Transaction, actor: SessionUser, group: GrowOutGroup): Promise<GrowOutGroupDto> {
  const today = await farmToday(tx, actor.coopId, group.farmId);
  const ctx = await contextOf(tx, actor.coopId, [group]);
  const info = ctx.info(group);
  const base = listItemOf(info, today);
  const projection = projectionOf(info);
  const names = await namesOf(info.all.map((w) => w.enteredBy), tx);
  const units = await housingUnitNamesOf(tx, actor.coopId, group.housingUnitId ? [group.housingUnitId] : []);

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
  const endAge = Math.max(84, Math.ceil((projection.projectedAgeDays ?? lastAge) + 7), lastAge + 7);
  const ages: number[] = [];
  for (let a = 28; a <= endAge; a += 7) ages.push(a);
  const coop = (await coopAverageFor(tx, actor.coopId, info.cross.key, ages)).map((r) => ({ ageDays: r.ageDays, grams: r.gramsPerHead === null ? null : Math.round(r.gramsPerHead), heads: r.heads, groups: r.weighIns }));
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
  const feed = (await feedTotalsByGroup(tx, actor.coopId, group.farmId)).get(group.id) ?? { grams: 0, costCents: 0 };
  const first = info.accepted[0];
  const last = info.accepted.at(-1);
  const conversion = first && last && first.weighedOn !== last.weighedOn
    ? groupFeedConversion({ feedGrams: feed.grams, startTotalGrams: first.totalGrams, endTotalGrams: last.totalGrams })
    : null;
  const money = canSeeMoney(actor, group.farmId);
  const cost = money && feed.grams > 0 ? feedCostPerWeight({ feedCostCents: feed.costCents, liveGrams: conversion && conversion.gainGrams > 0 ? conversion.gainGrams : null }) : null;
  const model = projectionModelName(projection);
  const schedule = weighInSchedule({
    birthDate: info.birthDate, agesDays: (await settingsOf(tx, group.farmId)).settings.weighInAgesDays, formedOn: group.formedOn,
    closedOn: group.closedOn, weighedOn: info.all.map((w) => w.weighedOn), today,
  });

  return {
    ...base,
    housingUnit: group.housingUnitId ? { id: group.housingUnitId, name: units.get(group.housingUnitId) ?? 'A pen' } : null,
    notes: group.notes,
    litters: info.members.map((m) => ({
      litterId: m.litterId, heads: m.heads, kindledOn: m.litter.kindledOn,
      dam: { id: m.litter.damId, name: ctx.parents.get(m.litter.damId)?.name ?? 'Unknown doe' },
      sire: { id: m.litter.sireId, name: ctx.parents.get(m.litter.sireId)?.name ?? 'Unknown buck' },
      cross: ctx.crossOf(m.litter),
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
    canEdit: defineAbilityFor(actor).can('update', subjectOf('GrowOutGroup', { coopId: actor.coopId, farmId: group.farmId })),
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

/** The farm's groups (growing, closed or all), with the projection of each and, for a date, which will be ready by then. */
export async function listGroups(actor: SessionUser, q: GrowOutListQuery): Promise<GrowOutListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'GrowOutGroup', { farmId }, 'Those groups', 'You may not see grow-out groups');
  return withTenant(actor, async (tx) => {
    const today = await farmToday(tx, actor.coopId, farmId);
    const groups = await GrowOutGroup.findAll({
      where: { coopId: actor.coopId, farmId, ...(q.status === 'all' ? {} : { status: q.status }) },
      order: [['status', 'DESC'], ['formedOn', 'DESC'], ['createdAt', 'DESC']],
      transaction: tx,
    });
    const ctx = await contextOf(tx, actor.coopId, groups);
    const items = groups.map((g) => listItemOf(ctx.info(g), today));
    let ready: GrowOutListDto['readyBy'] = null;
    if (q.readyBy) {
      const growing = groups.filter((g) => g.status === 'growing').map((g) => ({ id: g.id, name: g.name, projection: projectionOf(ctx.info(g)) }));
      ready = {
        date: q.readyBy,
        entries: readyBy(growing, q.readyBy).map((e) => ({
          groupId: e.group.id, name: e.group.name, readiness: e.readiness, words: readinessWords(e.readiness), projectedOn: e.projectedOn, headCount: e.headCount,
        })),
      };
    }
    // A new group aims at the farm's own target fryer weight (its Almanac settings; ≈ 5 lb until changed).
    const { settings } = await settingsOf(tx, farmId);
    return {
      groups: items, readyBy: ready, defaultTargetGrams: settings.targetLiveWeightGrams,
      canEdit: defineAbilityFor(actor).can('create', subjectOf('GrowOutGroup', { coopId: actor.coopId, farmId })),
    };
  });
}

export async function getGroup(actor: SessionUser, groupId: string): Promise<GrowOutGroupDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => detailOf(tx, actor, await groupFor(tx, actor, groupId)));
}

/** Kits already put in groups, by litter (every group that was formed: closed groups' kits went to market). */
async function headsInGroups(tx: Transaction, coopId: string, litterIds: string[]): Promise<Map<string, number>> {
  if (litterIds.length === 0) return new Map();
  const rows = await GrowOutGroupLitter.findAll({ where: { coopId, litterId: { [Op.in]: litterIds } }, transaction: tx });
  const live = new Set((await GrowOutGroup.findAll({ where: { id: { [Op.in]: rows.map((r) => r.groupId) } }, attributes: ['id'], transaction: tx })).map((g) => g.id));
  const result = new Map<string, number>();
  for (const r of rows) if (live.has(r.groupId)) result.set(r.litterId, (result.get(r.litterId) ?? 0) + r.heads);
  return result;
}

/** The farm's litters kits can be put in a group from: weaned or at weaning age, with kits not yet in a group. */
export async function litterChoices(actor: SessionUser): Promise<{ litters: LitterChoiceDto[] }> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'GrowOutGroup', { farmId }, 'Those litters', 'You may not see grow-out groups');
  return withTenant(actor, async (tx) => {
    const today = await farmToday(tx, actor.coopId, farmId);
    const litters = (await farmLitterFactsOf(tx, actor.coopId, farmId)).filter((l) => l.alive > 0 && daysBetween(l.kindledOn, today) <= 200);
    const used = await headsInGroups(tx, actor.coopId, litters.map((l) => l.id));
    const parents = await animalFactsOf(tx, actor.coopId, litters.flatMap((l) => [l.damId, l.sireId]));
    const choices = litters.map((l) => {
      const inGroups = used.get(l.id) ?? 0;
      return {
        litterId: l.id, kindledOn: l.kindledOn, ageDays: daysBetween(l.kindledOn, today),
        dam: { id: l.damId, name: parents.get(l.damId)?.name ?? 'Unknown doe' }, sire: { id: l.sireId, name: parents.get(l.sireId)?.name ?? 'Unknown buck' },
        crossLabel: crossLabel(parents.get(l.sireId)?.lineBreedName, parents.get(l.damId)?.lineBreedName).label,
        alive: l.alive, inGroups, available: Math.max(l.alive - inGroups, 0), weaned: l.weaned > 0,
      };
    }).filter((c) => c.available > 0 && (c.weaned || c.ageDays >= EARLIEST_GROW_OUT_AGE_DAYS));
    return { litters: choices };
  });
}

// ---------------------------------------------------------------------------------------------------
// Writing

/**
 * Forms a group from kits of the farm's litters. Refused (400, nothing written) for a litter not of the
 * farm, kits younger than weaning age and not weaned by the forming date, more heads than the litter has
 * alive beyond those already in groups, a pen not of the farm, or a date in the future.
 */
export async function formGroup(actor: SessionUser, input: GrowOutGroupCreateInput): Promise<GrowOutGroupDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'GrowOutGroup', { farmId }, 'That farm', 'Only members of the farm form grow-out groups');
  return withTenant(actor, async (tx) => {
    if (input.id) {
      const existing = await GrowOutGroup.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.farmId === farmId && existing.createdBy === actor.id) return detailOf(tx, actor, existing);
      if (existing) throw AppError.conflict('That id is already taken; reload and try again');
    }
    return detailOf(tx, actor, await formGroupIn(tx, actor, input));
  });
}

/** formGroup inside the caller's transaction (the demo loader); the same checks, no presenting. */
export async function formGroupIn(tx: Transaction, actor: SessionUser, input: GrowOutGroupCreateInput): Promise<GrowOutGroup> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'GrowOutGroup', { farmId }, 'That farm', 'Only members of the farm form grow-out groups');
  {
    await lockFarm(tx, farmId);
    const today = await farmToday(tx, actor.coopId, farmId);
    const errors: Record<string, string[]> = {};
    const add = (field: string, message: string) => (errors[field] ??= []).push(message);
    if (input.formedOn > today) add('formedOn', 'A group cannot be formed in the future');
    if (input.housingUnitId && !(await housingUnitOfFarm(tx, actor.coopId, farmId, input.housingUnitId))) add('housingUnitId', "Choose one of your farm's hutches or pens");
    const ids = input.litters.map((l) => l.litterId);
    if (new Set(ids).size !== ids.length) add('litters', 'Each litter once: add up its kits in one line');
    const facts = await litterFactsOf(tx, actor.coopId, ids);
    const used = await headsInGroups(tx, actor.coopId, ids);
    input.litters.forEach((entry, i) => {
      const l = facts.get(entry.litterId);
      const field = `litters.${i}.heads`;
      if (!l || l.farmId !== farmId) return add(`litters.${i}.litterId`, "That is not one of your farm's litters");
      if (input.formedOn < l.kindledOn) return add('formedOn', `The litter kindled on ${l.kindledOn} was not born yet`);
      const age = daysBetween(l.kindledOn, input.formedOn);
      const weanedBy = l.weanedOn !== null && l.weanedOn <= input.formedOn;
      if (!weanedBy && age < EARLIEST_GROW_OUT_AGE_DAYS) {
        add(field, `The kits kindled on ${l.kindledOn} are ${age} days old on ${input.formedOn}: put kits in a group at weaning, from ${EARLIEST_GROW_OUT_AGE_DAYS} days`);
      }
      const free = l.alive - (used.get(l.id) ?? 0);
      if (entry.heads > free) {
        add(field, free <= 0
          ? `All ${l.alive} kits alive of the litter kindled on ${l.kindledOn} are in groups already`
          : `The litter kindled on ${l.kindledOn} has ${free} kit${free === 1 ? '' : 's'} alive not yet in a group (${l.alive} alive)`);
      }
    });
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const group = await GrowOutGroup.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId, farmId, name: input.name, formedOn: input.formedOn, targetGrams: input.targetGrams,
        housingUnitId: input.housingUnitId ?? null, closedOn: null, notes: input.notes, createdBy: actor.id,
      },
      { transaction: tx },
    );
    await GrowOutGroupLitter.bulkCreate(input.litters.map((l) => ({ coopId: actor.coopId, groupId: group.id, litterId: l.litterId, heads: l.heads })), { transaction: tx });
    announce(tx, farmId, group.id);
    return group;
  }
}

/**
 * Weighs a group: the total and the head count, or each kit. Refused (400, nothing written) for a date
 * before the group was formed, after it closed or in the farm's future; more heads than the group has;
 * a weight per head (or a kit's) impossible for the age (checkWeightForAge). An apprentice's weigh-in
 * waits for the mentor's review and counts only once accepted.
 */
export async function recordGroupWeighIn(actor: SessionUser, groupId: string, input: GroupWeighInCreateInput): Promise<GrowOutGroupDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => {
    const group = await groupFor(tx, actor, groupId, true);
    ensureCan(actor, 'create', 'WeighIn', { farmId: group.farmId, enteredBy: actor.id }, 'That group', 'You may not weigh this group');
    if (input.id) {
      const existing = await weighInOwnerOf(tx, input.id);
      if (existing && existing.groupId === group.id && existing.enteredBy === actor.id) return detailOf(tx, actor, group);
      if (existing) throw AppError.conflict('That id is already taken; reload and try again');
    }
    await weighGroupIn(tx, actor, group, input);
    return detailOf(tx, actor, group);
  });
}

/** A group weigh-in inside the caller's transaction (the demo loader); the same checks. */
export async function weighGroupIn(tx: Transaction, actor: SessionUser, groupOrId: GrowOutGroup | string, input: GroupWeighInCreateInput): Promise<void> {
  const group = typeof groupOrId === 'string' ? await groupFor(tx, actor, groupOrId, true) : groupOrId;
  ensureCan(actor, 'create', 'WeighIn', { farmId: group.farmId, enteredBy: actor.id }, 'That group', 'You may not weigh this group');
  {
    const today = await farmToday(tx, actor.coopId, group.farmId);
    const ctx = await contextOf(tx, actor.coopId, [group]);
    const info = ctx.info(group);
    const kits = input.kits?.map((k) => ({ label: k.label || null, grams: k.grams })) ?? null;
    const totalGrams = kits ? kits.reduce((n, k) => n + k.grams, 0) : input.totalGrams!;
    const headCount = kits ? kits.length : input.headCount!;
    const errors: Record<string, string[]> = {};
    const add = (field: string, message: string) => (errors[field] ??= []).push(message);
    if (input.weighedOn > today) add('weighedOn', 'A weigh-in cannot be dated in the future');
    if (input.weighedOn < group.formedOn) add('weighedOn', `That is before the group was formed on ${group.formedOn}`);
    if (group.closedOn && input.weighedOn > group.closedOn) add('weighedOn', `The group was closed on ${group.closedOn}`);
    if (headCount > info.heads) add(kits ? 'kits' : 'headCount', `The group has ${info.heads} head${info.heads === 1 ? '' : 's'}; ${headCount} is more`);
    const age = input.weighedOn >= info.birthDate ? daysBetween(info.birthDate, input.weighedOn) : null;
    if (kits) {
      kits.forEach((k, i) => {
        const check = checkWeightForAge(k.grams, age, info.sizeClass);
        if (check?.level === 'error') add(`kits.${i}.grams`, `${k.label ?? `Kit ${i + 1}`}: ${check.message}`);
      });
    } else {
      const check = checkWeightForAge(totalGrams / headCount, age, info.sizeClass);
      if (check?.level === 'error') add('totalGrams', check.message);
    }
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    await insertGroupWeighIn(tx, {
      id: input.id, coopId: actor.coopId, farmId: group.farmId, groupId: group.id, weighedOn: input.weighedOn, totalGrams, headCount,
      kitWeights: kits, note: input.note, enteredBy: actor.id, reviewState: actor.role === 'apprentice' ? 'pending' : 'accepted',
    });
    // The litters' weigh-ins at the farm's ages in the Almanac: this weighing is the one due.
    await completeWeighInTasksOf(tx, actor, group.farmId, info.members.map((m) => m.litterId), input.weighedOn, `Weighed with ${group.name}`);
    announce(tx, group.farmId, group.id);
  }
}

/** Closes a group on a date (its kits processed, sold or kept); the version guards against a second editor. */
export async function closeGroup(actor: SessionUser, groupId: string, input: GrowOutGroupCloseInput): Promise<GrowOutGroupDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => detailOf(tx, actor, await closeGroupIn(tx, actor, groupId, input)));
}

/**
 * Closes a growing group whose last heads were just processed, in the processing record's transaction:
 * not an edit by a person, so no version to match. Left growing if it was weighed after that day.
 */
export async function closeEmptiedGroupIn(tx: Transaction, actor: SessionUser, groupId: string, closedOn: string): Promise<void> {
  const group = await groupFor(tx, actor, groupId, true);
  if (group.status === 'closed' || closedOn < group.formedOn) return;
  const lastWeighIn = (await groupWeighInsOf(tx, actor.coopId, [group.id])).at(-1);
  if (lastWeighIn && closedOn < lastWeighIn.weighedOn) return;
  group.status = 'closed';
  group.closedOn = closedOn;
  await group.save({ transaction: tx });
  announce(tx, group.farmId, group.id);
}

/** closeGroup inside the caller's transaction (the demo loader); the same checks. */
export async function closeGroupIn(tx: Transaction, actor: SessionUser, groupId: string, input: GrowOutGroupCloseInput): Promise<GrowOutGroup> {
  {
    const group = await groupFor(tx, actor, groupId, true);
    ensureCan(actor, 'update', 'GrowOutGroup', { farmId: group.farmId }, 'That group', 'Only members of the farm close groups');
    if (group.version !== input.version) throw AppError.staleVersion();
    if (group.status === 'closed') throw AppError.conflict(`The group was already closed on ${group.closedOn}`);
    const today = await farmToday(tx, actor.coopId, group.farmId);
    if (input.closedOn > today) throw AppError.validation({ closedOn: ['A group cannot be closed in the future'] });
    if (input.closedOn < group.formedOn) throw AppError.validation({ closedOn: [`That is before the group was formed on ${group.formedOn}`] });
    const lastWeighIn = (await groupWeighInsOf(tx, actor.coopId, [group.id])).at(-1);
    if (lastWeighIn && input.closedOn < lastWeighIn.weighedOn) throw AppError.validation({ closedOn: [`The group was weighed on ${lastWeighIn.weighedOn}, after that date`] });
    group.status = 'closed';
    group.closedOn = input.closedOn;
    await group.save({ transaction: tx });
    announce(tx, group.farmId, group.id);
    return group;
  }
}
