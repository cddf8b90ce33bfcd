import { Op, type Transaction } from 'sequelize';
import { addDays, daysBetween, gompertzWeight, readyBy, referenceCurve, type Readiness } from '@burrowline/shared';
import { acceptedGroupWeightsOf } from '../animals/group-weigh-ins.service';
import { litterParentsOf } from '../litters/litter-facts.service';
import { GrowOutGroup } from './grow-out-group.model';
import { contextOf, groupFeedTotals, headsOn, membersOf, soldHeadsOf } from './grow-out-context';
import { projectionOf } from './grow-out.presenter';
import { groupBy } from '../../lib/group-by';

export { groupHeadsOn } from './grow-out.presenter';

/*
 * Grow-out's published reads for other modules (feed, health, processing, performance), inside the
 * caller's transaction. Other modules never read the group models.
 */

export interface GrowOutFacts {
  id: string; farmId: string; name: string; formedOn: string; status: 'growing' | 'closed'; closedOn: string | null;
  targetGrams: number;
  litters: { litterId: string; heads: number; damId: string; sireId: string; kindledOn: string }[];
  /** Accepted group weigh-ins, oldest first. */
  weighIns: { weighedOn: string; totalGrams: number; headCount: number }[];
  /** Heads sold alive, by day (they leave the group like processed heads). */
  sold: { groupId: string; processedOn: string; headCount: number }[];
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
  // Plain rows and the litters' parents only: a farm's years of groups, read-only here.
  const groups = await GrowOutGroup.findAll({
    where: { coopId, farmId, ...(opts.groupIds ? { id: { [Op.in]: opts.groupIds } } : {}) },
    attributes: ['id', 'farmId', 'name', 'formedOn', 'status', 'closedOn', 'targetGrams', 'headsSold'],
    order: [['formedOn', 'ASC'], ['createdAt', 'ASC']],
    transaction: tx,
    raw: true,
  });
  const members = await membersOf(tx, groups.map((g) => g.id));
  const litters = await litterParentsOf(tx, coopId, members.map((m) => m.litterId));
  const weighIns = await acceptedGroupWeightsOf(tx, coopId, groups.map((g) => g.id));
  const feed = opts.withFeed === false ? new Map<string, { grams: number; costCents: number }>() : await groupFeedTotals(tx, coopId, farmId);
  const membersByGroup = groupBy(members, (m) => m.groupId);
  const weighInsByGroup = groupBy(weighIns, (w) => w.groupId);
  return groups.map((g) => ({
    id: g.id, farmId: g.farmId, name: g.name, formedOn: g.formedOn, status: g.status, closedOn: g.closedOn, targetGrams: g.targetGrams,
    litters: (membersByGroup.get(g.id) ?? []).map((m) => {
      const l = litters.get(m.litterId)!;
      return { litterId: m.litterId, heads: m.heads, damId: l.damId, sireId: l.sireId, kindledOn: l.kindledOn };
    }),
    weighIns: (weighInsByGroup.get(g.id) ?? []).map((w) => ({ weighedOn: w.weighedOn, totalGrams: w.totalGrams, headCount: w.headCount })),
    sold: soldHeadsOf(g),
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

/** Names of groups by id (another co-op's, and removed ones, are simply absent). */
export async function groupNamesOf(tx: Transaction, coopId: string, groupIds: string[]): Promise<Map<string, string>> {
  if (groupIds.length === 0) return new Map();
  const groups = await GrowOutGroup.findAll({
    where: { coopId, id: { [Op.in]: [...new Set(groupIds)] } }, attributes: ['id', 'name'], transaction: tx, raw: true,
  });
  return new Map(groups.map((g) => [g.id, g.name]));
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


export interface GroupReadiness {
  id: string;
  name: string;
  /** Heads the group has on `today`. */
  headsLeft: number;
  readiness: Readiness;
  projectedOn: string | null;
  crossLabel: string;
}

/** The farm's growing groups ranked by the projection: those reaching the target by `date` first (booking a processing day). */
export async function growingGroupsReadyBy(tx: Transaction, coopId: string, farmId: string, date: string, today: string): Promise<GroupReadiness[]> {
  const groups = await GrowOutGroup.findAll({ where: { coopId, farmId, status: 'growing' }, order: [['formedOn', 'ASC'], ['id', 'ASC']], transaction: tx });
  if (groups.length === 0) return [];
  const ctx = await contextOf(tx, coopId, groups);
  const ranked = readyBy(groups.map((g) => ({ g, projection: projectionOf(ctx.info(g)) })), date);
  return ranked.map((e) => ({
    id: e.group.g.id, name: e.group.g.name, headsLeft: headsOn(ctx.info(e.group.g), today), readiness: e.readiness,
    projectedOn: e.projectedOn, crossLabel: ctx.info(e.group.g).cross.label,
  }));
}

/** The breed or cross label of groups (growing or closed), by id. */
export async function crossLabelsOfGroups(tx: Transaction, coopId: string, groupIds: string[]): Promise<Map<string, { name: string; crossLabel: string }>> {
  if (groupIds.length === 0) return new Map();
  const groups = await GrowOutGroup.findAll({ where: { coopId, id: { [Op.in]: groupIds } }, transaction: tx });
  const ctx = await contextOf(tx, coopId, groups);
  return new Map(groups.map((g) => [g.id, { name: g.name, crossLabel: ctx.info(g).cross.label }]));
}
