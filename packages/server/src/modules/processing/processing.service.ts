import { Op, type Transaction } from 'sequelize';
import {
  addDays, checkLiveWeightAgainstLast, checkWeightForAge, daysBetween, dressOut, ErrorCode, groupBirthDate, RealtimeEvent, rooms, usdaClass,
  type ProcessingListDto, type ProcessingMarkCreateInput, type ProcessingMarkDto, type ProcessingRecordCreateInput,
  type ProcessingRecordDto, type YieldFlag,
} from '@burrowline/shared';
import { lockUntilCommit } from '../../db/advisory-lock';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { addMessage, ensureCan, farmOf, refuseOrConfirm, type FieldMessages } from '../farms/farm-access';
import { latestWeightsOf } from '../animals/weigh-ins.service';
import { farmClockOf } from '../farms/farm-clock';
import { presentAnimalRef } from '../animals/animal-facts.service';
import { presentContextOf } from '../almanac/tasks.service';
import { withdrawalsCovering, type WithdrawalFacts } from '../almanac/treatments.service';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf, type AnimalFacts } from '../animals/animal-facts.service';
import { applyStatusEvent } from '../animals/animal-status.service';
import { closeEmptiedGroupIn } from '../grow-out/grow-out.service';
import { groupHeadsOn, growOutFactsOfFarm, type GrowOutFacts } from '../grow-out/grow-out-facts.service';
import { namesOf } from '../users/users.service';
import { presentProcessingMark, presentProcessingRecord, type ProcessingPresentContext } from './processing.presenter';
import { ProcessingMark, ProcessingRecord } from './processing-record.model';

// ---------------------------------------------------------------------------------------------
// For performance, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

export interface ProcessingFacts {
  id: string;
  farmId: string;
  processedOn: string;
  animalId: string | null;
  groupId: string | null;
  headCount: number;
  /** Total of the record's heads. */
  liveGrams: number;
  hotCarcassGrams: number;
  chilledCarcassGrams: number | null;
  ageDays: number | null;
}

/** Every processing record of a farm, oldest first: one query. */
export async function processingFactsOfFarm(tx: Transaction, coopId: string, farmId: string): Promise<ProcessingFacts[]> {
  // Plain rows of the columns used: a farm's years of records, read-only here.
  const rows = await ProcessingRecord.findAll({
    where: { coopId, farmId },
    attributes: ['id', 'farmId', 'processedOn', 'animalId', 'groupId', 'headCount', 'liveGrams', 'hotCarcassGrams', 'chilledCarcassGrams', 'ageDays'],
    order: [['processedOn', 'ASC'], ['createdAt', 'ASC']],
    transaction: tx,
    raw: true,
  });
  return rows.map((r) => ({
    id: r.id, farmId: r.farmId, processedOn: r.processedOn, animalId: r.animalId, groupId: r.groupId, headCount: r.headCount,
    liveGrams: r.liveGrams, hotCarcassGrams: r.hotCarcassGrams, chilledCarcassGrams: r.chilledCarcassGrams, ageDays: r.ageDays,
  }));
}

// ---------------------------------------------------------------------------------------------

/** A group's birth date: the head-weighted mean of its litters' kindlings (as the grow-out screens count its age). */
/** A group's last accepted weigh-in, a head. */
function lastGroupWeight(group: GrowOutFacts): { gramsPerHead: number; weighedOn: string } | null {
  const last = group.weighIns.at(-1);
  return last ? { gramsPerHead: last.totalGrams / last.headCount, weighedOn: last.weighedOn } : null;
}

function birthOfGroup(group: GrowOutFacts): string | null {
  return group.litters.length > 0 ? groupBirthDate(group.litters) : null;
}

/**
 * Heads a group has left on a date: the head count of its latest accepted weigh-in by then (or the
 * heads it was formed with), less the heads processed since that weigh-in (on its day or after).
 */
function headsLeft(group: GrowOutFacts, processed: ProcessingFacts[], on: string): number {
  const formedHeads = group.litters.reduce((n, l) => n + l.heads, 0);
  // Every batch counts, even one dated after `on`: those heads are gone already (so do heads sold alive).
  const batches = [...processed, ...group.sold].filter((p) => p.groupId === group.id).map((p) => ({ processedOn: p.processedOn < on ? p.processedOn : on, headCount: p.headCount }));
  return groupHeadsOn({ formedHeads, weighIns: group.weighIns, processed: batches }, on);
}

function withdrawalMessage(w: WithdrawalFacts): string {
  const by = w.veterinarian ? `, set by ${w.veterinarian}` : '';
  return `Under withdrawal (${w.treatment}) through ${w.withdrawalEndsOn}${by}: it can be processed from ${addDays(w.withdrawalEndsOn, 1)}`;
}

interface Subject {
  animal: AnimalFacts | null;
  group: GrowOutFacts | null;
  birthDate: string | null;
}

/** The animal (owned and kept by the farm, still on it) or the growing group a record or mark is for; field errors otherwise. */
async function subjectOf(
  tx: Transaction, actor: SessionUser, farmId: string, input: { animalId?: string; groupId?: string }, groups: GrowOutFacts[], errors: FieldMessages,
  /** The processing date (a record): a closed group's heads may be recorded up to its closing day. None for a mark. */
  processedOn?: string,
): Promise<Subject> {
  if (input.animalId) {
    const animal = (await animalFactsOf(tx, actor.coopId, [input.animalId])).get(input.animalId) ?? null;
    if (!animal || animal.isOutside || animal.keepingFarmId !== farmId || animal.owningFarmId !== farmId) {
      addMessage(errors, 'animalId', 'Choose an animal your farm owns and keeps');
      return { animal: null, group: null, birthDate: null };
    }
    if (animal.disposition !== 'on_farm') addMessage(errors, 'animalId', `${animal.name || animal.tattoo || 'That animal'} is no longer on the farm (${animal.disposition.replace('_', ' ')})`);
    return { animal, group: null, birthDate: animal.birthDate };
  }
  const group = groups.find((g) => g.id === input.groupId) ?? null;
  if (!group) {
    addMessage(errors, 'groupId', 'Choose a grow-out group of your farm');
    return { animal: null, group: null, birthDate: null };
  }
  if (group.status === 'closed' && (!processedOn || processedOn > group.closedOn!)) addMessage(errors, 'groupId', `${group.name} was closed on ${group.closedOn}`);
  return { animal: null, group, birthDate: birthOfGroup(group) };
}

async function presentContext(tx: Transaction, coopId: string, today: string, groups: GrowOutFacts[], rows: { animalId: string | null; userId: string | null }[]): Promise<ProcessingPresentContext> {
  const ctx = await presentContextOf(tx, coopId, today, { animalIds: rows.map((r) => r.animalId) });
  return {
    animalRef: (id) => presentAnimalRef(id, ctx),
    groupNames: new Map(groups.map((g) => [g.id, g.name])),
    names: await namesOf(rows.map((r) => r.userId), tx),
  };
}

function announceProcessing(tx: Transaction, farmId: string): void {
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.processingChanged, { farmId }));
}

const rounded = (v: number | null) => (v === null ? null : Math.round(v * 100) / 100);

/**
 * Records one animal, or a batch of a grow-out group's heads, processed on a date: the live and carcass
 * weights (totals), the age, the dress-out and the USDA class computed and kept with the record, with
 * flags for figures outside the usual range. Refused with nothing written: a date in the future, an
 * animal not the farm's or no longer on it, more heads than the group has left, an animal or group
 * under withdrawal on that date, a weight impossible for the age. The animal's disposition becomes
 * 'processed' (through the Herd, with its history); a planned mark for it is done.
 */
export async function recordProcessing(actor: SessionUser, input: ProcessingRecordCreateInput): Promise<ProcessingRecordDto> {
  return withTenant(actor, (tx) => recordProcessingIn(tx, actor, input));
}

/** recordProcessing inside the caller's transaction (the demo loader; later, shared processing days). */
export async function recordProcessingIn(tx: Transaction, actor: SessionUser, input: ProcessingRecordCreateInput): Promise<ProcessingRecordDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'ProcessingRecord', { farmId }, 'That farm', 'Only members of the farm record processing');
  // Two batches saved at once must not both take a group's last heads.
  await lockUntilCommit(tx, `processing:${farmId}`);
  const clock = await farmClockOf(tx, actor.coopId, farmId);
  const groups = await growOutFactsOfFarm(tx, actor.coopId, farmId, { groupIds: input.groupId ? [input.groupId] : [], withFeed: false });
  if (input.id) {
    const existing = await ProcessingRecord.findOne({ where: { id: input.id }, transaction: tx });
    if (existing) {
      if (existing.farmId !== farmId) throw AppError.idTaken();
      return presentProcessingRecord(existing, await presentContext(tx, actor.coopId, clock.today, groups, [{ animalId: existing.animalId, userId: existing.recordedBy }]));
    }
  }
  const errors: FieldMessages = {};
  if (input.processedOn > clock.today) addMessage(errors, 'processedOn', `${input.processedOn} is in the future (today is ${clock.today})`);
  const subject = await subjectOf(tx, actor, farmId, input, groups, errors, input.processedOn);
  const field = input.animalId ? 'animalId' : 'groupId';
  if (subject.birthDate && input.processedOn < subject.birthDate) addMessage(errors, 'processedOn', `That is before it was born (${subject.birthDate})`);
  const processed = await processingFactsOfFarm(tx, actor.coopId, farmId);
  let headsLeftAfter: number | null = null;
  if (subject.group) {
    const left = headsLeft(subject.group, processed, input.processedOn);
    headsLeftAfter = left - input.headCount;
    if (input.headCount > left) addMessage(errors, 'headCount', `${subject.group.name} has ${left} head${left === 1 ? '' : 's'} left; ${input.headCount} cannot be processed from it`);
  }
  if (subject.animal || subject.group) {
    const covering = await withdrawalsCovering(tx, actor.coopId, { animalIds: input.animalId ? [input.animalId] : [], groupIds: input.groupId ? [input.groupId] : [] }, input.processedOn);
    const w = input.animalId ? covering.animals.get(input.animalId) : covering.groups.get(input.groupId!);
    if (w) addMessage(errors, field, withdrawalMessage(w));
  }
  const ageDays = subject.birthDate && input.processedOn >= subject.birthDate ? daysBetween(subject.birthDate, input.processedOn) : null;
  const perHead = input.liveGrams / input.headCount;
  const weightCheck = checkWeightForAge(perHead, ageDays);
  if (weightCheck?.level === 'error') addMessage(errors, 'liveGrams', weightCheck.message);
  const yieldOf = dressOut({ liveGrams: input.liveGrams, hotCarcassGrams: input.hotCarcassGrams, chilledCarcassGrams: input.chilledCarcassGrams });
  for (const flag of yieldOf.flags) if (flag.level === 'error') addMessage(errors, flag.field, flag.message);
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);
  // The live weight against the last weigh-in carried forward to the day: a slip of the scale or the head count asks to confirm.
  const lastWeight = subject.group
    ? lastGroupWeight(subject.group)
    : subject.animal ? (await latestWeightsOf(tx, actor.coopId, farmId, 'animal_id', [subject.animal.id])).get(subject.animal.id) ?? null : null;
  const farFromLast = lastWeight && checkLiveWeightAgainstLast({
    liveGramsPerHead: perHead, processedOn: input.processedOn,
    last: { ...lastWeight, ageDays: subject.birthDate && lastWeight.weighedOn >= subject.birthDate ? daysBetween(subject.birthDate, lastWeight.weighedOn) : null },
  });
  refuseOrConfirm({}, farFromLast ? { liveGrams: [farFromLast.message] } : {}, input.confirm);

  const classed = usdaClass({
    birthDate: subject.birthDate, processedOn: input.processedOn,
    carcassGrams: (input.chilledCarcassGrams ?? input.hotCarcassGrams) / input.headCount,
  });
  const flags: YieldFlag[] = yieldOf.flags.filter((f) => f.level === 'warning');
  const row = await ProcessingRecord.create(
    {
      ...(input.id ? { id: input.id } : {}),
      coopId: actor.coopId, farmId, processedOn: input.processedOn,
      animalId: input.animalId ?? null, groupId: input.groupId ?? null, headCount: input.headCount, ageDays,
      liveGrams: input.liveGrams, hotCarcassGrams: input.hotCarcassGrams, chilledCarcassGrams: input.chilledCarcassGrams,
      hotDressOutPercent: rounded(yieldOf.hotPercent)!, chilledDressOutPercent: rounded(yieldOf.chilledPercent),
      usdaClass: classed.usdaClass, usdaClassReason: classed.reason, usdaClassNote: classed.note,
      flags, notes: input.notes, recordedBy: actor.id,
    },
    { transaction: tx },
  );
  await recordChanges({ coopId: actor.coopId, tableName: 'processing_records', recordId: row.id, actorUserId: actor.id, changes: { created: [null, `${input.headCount} head(s) on ${input.processedOn}`] } }, tx);
  if (input.animalId) {
    await applyStatusEvent(tx, actor, input.animalId, { kind: 'disposition', value: 'processed', effectiveOn: input.processedOn, cause: 'Processing record' });
  }
  // The group's last heads: it is done growing.
  if (input.groupId && headsLeftAfter === 0) await closeEmptiedGroupIn(tx, actor, input.groupId, input.processedOn);
  await ProcessingMark.update(
    { status: 'done' },
    { where: { farmId, status: 'planned', ...(input.animalId ? { animalId: input.animalId } : { groupId: input.groupId! }) }, transaction: tx },
  );
  announceProcessing(tx, farmId);
  return presentProcessingRecord(row, await presentContext(tx, actor.coopId, clock.today, groups, [{ animalId: row.animalId, userId: actor.id }]));
}

/**
 * Marks an animal or a growing group for processing on a planned date. Refused while a veterinarian's
 * withdrawal covers today or the planned date (it can be marked once the withdrawal is over); breeding
 * is not blocked by a withdrawal. One planned mark per animal and per group.
 */
export async function markForProcessing(actor: SessionUser, input: ProcessingMarkCreateInput): Promise<ProcessingMarkDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'ProcessingRecord', { farmId }, 'That farm', 'Only members of the farm mark animals for processing');
  return withTenant(actor, async (tx) => {
    // The farm's processing lock: a mark and a processing record of one animal or group are decided one at a time.
    await lockUntilCommit(tx, `processing:${farmId}`);
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const groups = await growOutFactsOfFarm(tx, actor.coopId, farmId, { groupIds: input.groupId ? [input.groupId] : [], withFeed: false });
    if (input.id) {
      const existing = await ProcessingMark.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      const sameMark = existing && existing.farmId === farmId && !existing.deletedAt
        && existing.animalId === (input.animalId ?? null) && existing.groupId === (input.groupId ?? null);
      if (sameMark) {
        return presentProcessingMark(existing, await presentContext(tx, actor.coopId, clock.today, groups, [{ animalId: existing.animalId, userId: existing.markedBy }]), null);
      }
      if (existing) throw AppError.idTaken();
    }
    const errors: FieldMessages = {};
    if (input.plannedOn < clock.today) addMessage(errors, 'plannedOn', `Plan it for today (${clock.today}) or later`);
    const subject = await subjectOf(tx, actor, farmId, input, groups, errors);
    const field = input.animalId ? 'animalId' : 'groupId';
    if (subject.animal || subject.group) {
      const ids = { animalIds: input.animalId ? [input.animalId] : [], groupIds: input.groupId ? [input.groupId] : [] };
      for (const date of new Set([clock.today, input.plannedOn])) {
        const covering = await withdrawalsCovering(tx, actor.coopId, ids, date);
        const w = input.animalId ? covering.animals.get(input.animalId) : covering.groups.get(input.groupId!);
        if (w) {
          addMessage(errors, field, withdrawalMessage(w).replace('it can be processed from', 'it can be marked for processing from'));
          break;
        }
      }
      const open = await ProcessingMark.findOne({ where: { farmId, status: 'planned', ...(input.animalId ? { animalId: input.animalId } : { groupId: input.groupId! }) }, transaction: tx });
      if (open) throw new AppError(ErrorCode.conflict, 409, `Already marked for processing on ${open.plannedOn}`);
    }
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const row = await ProcessingMark.create(
      { ...(input.id ? { id: input.id } : {}), coopId: actor.coopId, farmId, animalId: input.animalId ?? null, groupId: input.groupId ?? null, plannedOn: input.plannedOn, notes: input.notes, markedBy: actor.id },
      { transaction: tx },
    );
    announceProcessing(tx, farmId);
    return presentProcessingMark(row, await presentContext(tx, actor.coopId, clock.today, groups, [{ animalId: row.animalId, userId: actor.id }]), null);
  });
}

/** Cancels a planned mark (the version the member saw: two people cancelling at once get a 409). */
export async function cancelMark(actor: SessionUser, markId: string, version: number): Promise<ProcessingMarkDto> {
  return withTenant(actor, async (tx) => {
    const mark = await ProcessingMark.findOne({ where: { id: markId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!mark) throw AppError.notFound('That mark');
    ensureCan(actor, 'update', 'ProcessingRecord', { farmId: mark.farmId }, 'That mark', 'Only members of the farm cancel marks for processing');
    if (mark.version !== version) throw new AppError(ErrorCode.conflict, 409, 'Someone changed this mark meanwhile; reload it');
    if (mark.status !== 'planned') throw new AppError(ErrorCode.conflict, 409, `That mark is already ${mark.status}`);
    mark.status = 'cancelled';
    await mark.save({ transaction: tx });
    announceProcessing(tx, mark.farmId);
    const clock = await farmClockOf(tx, actor.coopId, mark.farmId);
    const groups = await growOutFactsOfFarm(tx, actor.coopId, mark.farmId, { withFeed: false });
    return presentProcessingMark(mark, await presentContext(tx, actor.coopId, clock.today, groups, [{ animalId: mark.animalId, userId: mark.markedBy }]), null);
  });
}

/** The farm's processing records (latest first) and its planned marks (soonest first). Apprentices read them. */
export async function listProcessing(actor: SessionUser): Promise<ProcessingListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'ProcessingRecord', { farmId }, 'That farm');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const groups = await growOutFactsOfFarm(tx, actor.coopId, farmId, { withFeed: false });
    const records = await ProcessingRecord.findAll({ where: { farmId }, order: [['processedOn', 'DESC'], ['createdAt', 'DESC']], limit: 500, transaction: tx });
    const marks = await ProcessingMark.findAll({ where: { farmId, status: 'planned' }, order: [['plannedOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
    const ctx = await presentContext(tx, actor.coopId, clock.today, groups, [
      ...records.map((r) => ({ animalId: r.animalId, userId: r.recordedBy })),
      ...marks.map((m) => ({ animalId: m.animalId, userId: m.markedBy })),
    ]);
    const covering = await withdrawalsCovering(tx, actor.coopId, {
      animalIds: marks.flatMap((m) => (m.animalId ? [m.animalId] : [])), groupIds: marks.flatMap((m) => (m.groupId ? [m.groupId] : [])),
    }, clock.today);
    return {
      today: clock.today,
      records: records.map((r) => presentProcessingRecord(r, ctx)),
      marks: marks.map((m) => presentProcessingMark(m, ctx, (m.animalId ? covering.animals.get(m.animalId) : covering.groups.get(m.groupId!))?.withdrawalEndsOn ?? null)),
    };
  });
}

/** The heads processed from these grow-out groups, by day (for grow-out's head counts, through its port). */
export async function processedHeadsOf(tx: Transaction, coopId: string, groupIds: string[]): Promise<{ groupId: string; processedOn: string; headCount: number }[]> {
  if (groupIds.length === 0) return [];
  const rows = await ProcessingRecord.findAll({
    where: { coopId, groupId: { [Op.in]: groupIds } }, attributes: ['groupId', 'processedOn', 'headCount'], raw: true, transaction: tx,
  });
  return rows.map((r) => ({ groupId: r.groupId!, processedOn: r.processedOn, headCount: r.headCount }));
}

/** The farm's animals planned for processing (individual culls), for booking a shared day. */
export async function plannedAnimalMarksOf(tx: Transaction, coopId: string, farmId: string): Promise<{ animalId: string; plannedOn: string }[]> {
  const rows = await ProcessingMark.findAll({
    where: { coopId, farmId, status: 'planned', animalId: { [Op.ne]: null } },
    attributes: ['animalId', 'plannedOn'],
    order: [['plannedOn', 'ASC'], ['id', 'ASC']],
    transaction: tx,
    raw: true,
  });
  return rows.map((r) => ({ animalId: r.animalId!, plannedOn: r.plannedOn }));
}

/** Processing records by id (a shared day's yields), as plain facts. */
export async function processingFactsByIds(tx: Transaction, coopId: string, ids: string[]): Promise<ProcessingFacts[]> {
  if (ids.length === 0) return [];
  const rows = await ProcessingRecord.findAll({
    where: { coopId, id: { [Op.in]: ids } },
    attributes: ['id', 'farmId', 'processedOn', 'animalId', 'groupId', 'headCount', 'liveGrams', 'hotCarcassGrams', 'chilledCarcassGrams', 'ageDays'],
    transaction: tx,
    raw: true,
  });
  return rows.map((r) => ({
    id: r.id, farmId: r.farmId, processedOn: r.processedOn, animalId: r.animalId, groupId: r.groupId, headCount: r.headCount,
    liveGrams: r.liveGrams, hotCarcassGrams: r.hotCarcassGrams, chilledCarcassGrams: r.chilledCarcassGrams, ageDays: r.ageDays,
  }));
}
