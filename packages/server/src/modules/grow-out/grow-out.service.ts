import { Op, type Transaction } from 'sequelize';
import {
  countOf,  averageWeightByAge, checkWeightForAge, crossLabel, daysBetween, defineAbilityFor, EARLIEST_GROW_OUT_AGE_DAYS, readinessWords, readyBy, RealtimeEvent, rooms, subjectOf, type GroupWeighInCreateInput, type GrowOutGroupCloseInput, type GrowOutGroupCreateInput, type GrowOutGroupDto, type GrowOutListDto, type GrowOutListQuery, type LitterChoiceDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { settingsOf } from '../almanac/cycle-settings.service';
import { completeWeighInTasksOf } from '../almanac/tasks.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { groupWeighInsOf, insertGroupWeighIn, weighInOwnerOf } from '../animals/group-weigh-ins.service';
import { addMessage, canSeeMoney, ensureCan, farmOf } from '../farms/farm-access';
import { farmTodayOf } from '../farms/farm-clock';
import { farmLitterFactsOf, housingUnitNamesOf, housingUnitOfFarm, litterFactsOf } from '../litters/litter-facts.service';
import { namesOf } from '../users/users.service';
import { GrowOutGroup, GrowOutGroupLitter } from './grow-out-group.model';
import { contextOf, groupFeedTotals } from './grow-out-context';
import { chartAgesOf, headsLeftOn, listItemOf, presentGroupDetail, projectionOf } from './grow-out.presenter';
import { lockUntilCommit } from '../../db/advisory-lock';

/* Grow-out groups as their screens read and write them; processing calls closeEmptiedGroupIn. */

// ---------------------------------------------------------------------------------------------------
// Access

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

async function detailOf(tx: Transaction, actor: SessionUser, group: GrowOutGroup): Promise<GrowOutGroupDto> {
  const ctx = await contextOf(tx, actor.coopId, [group]);
  const info = ctx.info(group);
  return presentGroupDetail(info, {
    today: await farmTodayOf(tx, actor.coopId, group.farmId),
    parents: ctx.parents,
    crossOf: ctx.crossOf,
    names: await namesOf(info.all.map((w) => w.enteredBy), tx),
    units: await housingUnitNamesOf(tx, actor.coopId, group.housingUnitId ? [group.housingUnitId] : []),
    coopAverage: await coopAverageFor(tx, actor.coopId, info.cross.key, chartAgesOf(info)),
    feed: (await groupFeedTotals(tx, actor.coopId, group.farmId)).get(group.id) ?? { grams: 0, costCents: 0 },
    weighInAgesDays: (await settingsOf(tx, group.farmId)).settings.weighInAgesDays,
    canSeeMoney: canSeeMoney(actor, group.farmId),
    canEdit: defineAbilityFor(actor).can('update', subjectOf('GrowOutGroup', { coopId: actor.coopId, farmId: group.farmId })),
  });
}

/** The farm's groups (growing, closed or all), with the projection of each and, for a date, which will be ready by then. */
export async function listGroups(actor: SessionUser, q: GrowOutListQuery): Promise<GrowOutListDto> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  ensureCan(actor, 'read', 'GrowOutGroup', { farmId }, 'Those groups', 'You may not see grow-out groups');
  return withTenant(actor, async (tx) => {
    const today = await farmTodayOf(tx, actor.coopId, farmId);
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
  farmOf(actor, 'Only a member of a farm keeps grow-out groups');
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
  const farmId = farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  ensureCan(actor, 'read', 'GrowOutGroup', { farmId }, 'Those litters', 'You may not see grow-out groups');
  return withTenant(actor, async (tx) => {
    const today = await farmTodayOf(tx, actor.coopId, farmId);
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
  const farmId = farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  ensureCan(actor, 'create', 'GrowOutGroup', { farmId }, 'That farm', 'Only members of the farm form grow-out groups');
  return withTenant(actor, async (tx) => {
    if (input.id) {
      const existing = await GrowOutGroup.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.farmId === farmId && existing.createdBy === actor.id) return detailOf(tx, actor, existing);
      if (existing) throw AppError.idTaken();
    }
    return detailOf(tx, actor, await formGroupIn(tx, actor, input));
  });
}

/** formGroup inside the caller's transaction (the demo loader); the same checks, no presenting. */
export async function formGroupIn(tx: Transaction, actor: SessionUser, input: GrowOutGroupCreateInput): Promise<GrowOutGroup> {
  const farmId = farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  ensureCan(actor, 'create', 'GrowOutGroup', { farmId }, 'That farm', 'Only members of the farm form grow-out groups');
  {
    await lockFarm(tx, farmId);
    const today = await farmTodayOf(tx, actor.coopId, farmId);
    const errors: Record<string, string[]> = {};
    const add = (field: string, message: string) => addMessage(errors, field, message);
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
        add(field, `The kits kindled on ${l.kindledOn} are ${countOf(age, 'day')} old on ${input.formedOn}: put kits in a group at weaning, from ${EARLIEST_GROW_OUT_AGE_DAYS} days`);
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
  farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  return withTenant(actor, async (tx) => {
    const group = await groupFor(tx, actor, groupId, true);
    ensureCan(actor, 'create', 'WeighIn', { farmId: group.farmId, enteredBy: actor.id }, 'That group', 'You may not weigh this group');
    if (input.id) {
      const existing = await weighInOwnerOf(tx, input.id);
      if (existing && existing.groupId === group.id && existing.enteredBy === actor.id) return detailOf(tx, actor, group);
      if (existing) throw AppError.idTaken();
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
    const today = await farmTodayOf(tx, actor.coopId, group.farmId);
    const ctx = await contextOf(tx, actor.coopId, [group]);
    const info = ctx.info(group);
    const kits = input.kits?.map((k) => ({ label: k.label || null, grams: k.grams })) ?? null;
    const totalGrams = kits ? kits.reduce((n, k) => n + k.grams, 0) : input.totalGrams!;
    const headCount = kits ? kits.length : input.headCount!;
    const errors: Record<string, string[]> = {};
    const add = (field: string, message: string) => addMessage(errors, field, message);
    if (input.weighedOn > today) add('weighedOn', 'A weigh-in cannot be dated in the future');
    if (input.weighedOn < group.formedOn) add('weighedOn', `That is before the group was formed on ${group.formedOn}`);
    if (group.closedOn && input.weighedOn > group.closedOn) add('weighedOn', `The group was closed on ${group.closedOn}`);
    const heads = headsLeftOn(info, input.weighedOn);
    if (headCount > heads) add(kits ? 'kits' : 'headCount', `The group has ${heads} head${heads === 1 ? '' : 's'}; ${headCount} is more`);
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
  farmOf(actor, 'Only a member of a farm keeps grow-out groups');
  return withTenant(actor, async (tx) => detailOf(tx, actor, await closeGroupIn(tx, actor, groupId, input)));
}

/**
 * Closes a growing group whose last heads were just processed, in the processing record's transaction:
 * not an edit by a person, so no version to match. Left growing if it was weighed after that day.
 */
export async function closeEmptiedGroupIn(tx: Transaction, actor: SessionUser, groupId: string, closedOn: string): Promise<void> {
  await closeEmptied(tx, await groupFor(tx, actor, groupId, true), closedOn);
}

async function closeEmptied(tx: Transaction, group: GrowOutGroup, closedOn: string): Promise<void> {
  if (group.status === 'closed' || closedOn < group.formedOn) return;
  const lastWeighIn = (await groupWeighInsOf(tx, group.coopId, [group.id])).at(-1);
  if (lastWeighIn && closedOn < lastWeighIn.weighedOn) return;
  group.status = 'closed';
  group.closedOn = closedOn;
  await group.save({ transaction: tx });
  announce(tx, group.farmId, group.id);
}

/**
 * Takes heads out of a growing group alive (a sale through the Swap Board), in the caller's transaction;
 * they count against the group like processed heads, and the group closes once emptied. Refused (409)
 * when the group is closed or has fewer heads on the day. The same source again takes none.
 */
export async function sellHeadsIn(
  tx: Transaction,
  actor: SessionUser,
  input: { farmId: string; groupId: string; soldOn: string; headCount: number; sourceId: string },
): Promise<void> {
  // Processing takes a group's heads under the same lock: a sale and a batch never both take the last heads.
  await lockUntilCommit(tx, `processing:${input.farmId}`);
  const group = await GrowOutGroup.findOne({ where: { id: input.groupId, coopId: actor.coopId, farmId: input.farmId }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!group) throw AppError.conflict('That grow-out group is no longer on the farm');
  if (group.headsSold.some((s) => s.sourceId === input.sourceId)) return;
  if (group.status === 'closed') throw AppError.conflict(`${group.name} was closed on ${group.closedOn}; its heads can no longer be sold`);
  const left = headsLeftOn((await contextOf(tx, actor.coopId, [group])).info(group), input.soldOn);
  if (input.headCount > left) {
    throw AppError.conflict(`${group.name} has ${countOf(left, 'head')} left; ${input.headCount} cannot leave it`, { headCount: [`${group.name} has ${countOf(left, 'head')} left`] });
  }
  group.headsSold = [...group.headsSold, { soldOn: input.soldOn, headCount: input.headCount, sourceId: input.sourceId }];
  await group.save({ transaction: tx });
  if (left === input.headCount) await closeEmptied(tx, group, input.soldOn);
  announce(tx, group.farmId, group.id);
}

/** closeGroup inside the caller's transaction (the demo loader); the same checks. */
export async function closeGroupIn(tx: Transaction, actor: SessionUser, groupId: string, input: GrowOutGroupCloseInput): Promise<GrowOutGroup> {
  {
    const group = await groupFor(tx, actor, groupId, true);
    ensureCan(actor, 'update', 'GrowOutGroup', { farmId: group.farmId }, 'That group', 'Only members of the farm close groups');
    if (group.version !== input.version) throw AppError.staleVersion();
    if (group.status === 'closed') throw AppError.conflict(`The group was already closed on ${group.closedOn}`);
    const today = await farmTodayOf(tx, actor.coopId, group.farmId);
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

/**
 * A farm's growing groups (or the ones asked for) as a weighing round weighs them: heads on the day, the
 * kits' mean birth date, breed size and last weight per head (pending weigh-ins are the latest word).
 */
export async function groupsToWeigh(
  tx: Transaction, coopId: string, farmId: string, on: string, groupIds?: string[],
): Promise<{ id: string; name: string; status: 'growing' | 'closed'; formedOn: string; birthDate: string; sizeClass: 'small' | 'medium' | 'large' | 'giant'; heads: number; last: { gramsPerHead: number; weighedOn: string } | null }[]> {
  const groups = await GrowOutGroup.findAll({
    where: { coopId, farmId, ...(groupIds ? { id: { [Op.in]: groupIds } } : { status: 'growing' }) },
    order: [['formedOn', 'ASC'], ['name', 'ASC']],
    transaction: tx,
  });
  const ctx = await contextOf(tx, coopId, groups);
  return groups.map((g) => {
    const info = ctx.info(g);
    const last = info.all.at(-1);
    return {
      id: g.id, name: g.name, status: g.status, formedOn: g.formedOn, birthDate: info.birthDate, sizeClass: info.sizeClass, heads: headsLeftOn(info, on),
      last: last ? { gramsPerHead: Math.round(last.totalGrams / last.headCount), weighedOn: last.weighedOn } : null,
    };
  });
}
