import { literal, Op, type Transaction } from 'sequelize';
import {
  checkPalpationDate, checkService, daysBetween, ErrorCode, kindlingStatus, MEDIUM_BREED_FIRST_BREEDING_DAYS,
  planAfterPalpation, planFromService, serviceOutcome, settleServiceTasksOnKindling, type ServiceOutcome, type BreedingCheck, type BreedingStockDto,
  type BreedingStockListDto, type CycleSettings, type PalpationCreateInput, type ServiceClosureInput,
  type ServiceCreateInput, type ServiceDto, type ServiceListDto, type ServiceListQuery,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf, farmBreedingStockOf, type AnimalFacts } from '../animals/animal-facts.service';
import { addMessage, ensureCan, farmOf, refuseOrConfirm, type FieldMessages } from '../farms/farm-access';
import { announceAlmanac } from './almanac-events.service';
import { farmClockOf } from '../farms/farm-clock';
import { presentService, presentServiceListItem } from './almanac.presenter';
import { settingsOf } from './cycle-settings.service';
import { Palpation } from './palpation.model';
import { ServiceRecord } from './service-record.model';
import { openTasksOfAnimal, presentContextOf, tasksOf } from './tasks.service';
import { insertPlannedTasks, markTasksDone, skipTasks, toTaskRecord } from './task-writer.service';
import { treatmentsCovering } from './treatments.service';

/** What litters need of a service to kindle it. */
export interface ServiceFacts {
  id: string;
  coopId: string;
  farmId: string;
  doeId: string;
  buckId: string;
  servicedOn: string;
  status: ServiceRecord['status'];
}

function toMessages(checks: BreedingCheck[], level: BreedingCheck['level']): FieldMessages {
  const messages: FieldMessages = {};
  for (const check of checks) if (check.level === level) addMessage(messages, check.field, check.message);
  return messages;
}

function statusOf(service: ServiceRecord, today: string, settings: CycleSettings) {
  return service.status === 'open' ? kindlingStatus(service.servicedOn, today, settings) : null;
}

/** A service of the co-op for the actor: another farm's does not exist for them (404). */
async function serviceFor(tx: Transaction, actor: SessionUser, serviceId: string, action: 'read' | 'update'): Promise<ServiceRecord> {
  const service = await ServiceRecord.findOne({ where: { id: serviceId, coopId: actor.coopId }, transaction: tx, lock: action === 'update' ? tx.LOCK.UPDATE : undefined });
  if (!service || service.farmId !== actor.farmId) throw AppError.notFound('That service');
  ensureCan(actor, action, 'Service', { farmId: service.farmId }, 'That service', 'Only members of the farm record services and palpations');
  return service;
}

async function serviceDetail(tx: Transaction, actor: SessionUser, service: ServiceRecord): Promise<ServiceDto> {
  const clock = await farmClockOf(tx, actor.coopId, service.farmId);
  const { settings } = await settingsOf(tx, service.farmId);
  const palpations = await Palpation.findAll({ where: { serviceId: service.id, reviewState: { [Op.ne]: 'returned' } }, order: [['palpatedOn', 'ASC'], ['createdAt', 'ASC']], transaction: tx });
  const tasks = await tasksOf(tx, { serviceId: service.id });
  const ctx = await presentContextOf(tx, actor.coopId, clock.today, {
    animalIds: [service.doeId, service.buckId, ...tasks.map((t) => t.animalId)],
    userIds: [service.recordedBy, ...palpations.map((p) => p.recordedBy), ...tasks.map((t) => t.doneBy)],
  });
  return presentService(service, { palpations, tasks, kindlingStatus: statusOf(service, clock.today, settings) }, ctx);
}

/**
 * The does and bucks the farm keeps (a buck on loan here included), with what the service form warns
 * about: her open service, a treatment, her age against her breed's first-breeding age.
 */
export async function breedingStock(actor: SessionUser): Promise<BreedingStockListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Service', { farmId }, 'That herd');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const stock = await farmBreedingStockOf(tx, actor.coopId, farmId);
    const ids = stock.map((a) => a.id);
    const open = await ServiceRecord.findAll({ where: { doeId: { [Op.in]: ids }, status: 'open' }, transaction: tx });
    const kindled = await ServiceRecord.findAll({
      where: { doeId: { [Op.in]: ids }, status: 'kindled' },
      attributes: ['doeId', 'closedOn'],
      order: [['closedOn', 'DESC']],
      transaction: tx,
    });
    const treated = await treatmentsCovering(tx, ids, clock.today);
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, {});
    const present = (a: AnimalFacts): BreedingStockDto => {
      const openService = open.find((s) => s.doeId === a.id);
      const treatment = treated.get(a.id);
      const fromFarm = a.owningFarmId && a.owningFarmId !== farmId ? { id: a.owningFarmId, name: ctx.farms.get(a.owningFarmId)?.name ?? 'Another farm' } : null;
      return {
        id: a.id,
        name: a.name,
        tattoo: a.tattoo,
        sex: a.sex,
        birthDate: a.birthDate,
        breedName: a.breedName,
        firstBreedingDays: (a.firstBreedingMinDays ?? MEDIUM_BREED_FIRST_BREEDING_DAYS)[a.sex],
        onLoanFrom: fromFarm,
        openService: openService ? { id: openService.id, servicedOn: openService.servicedOn } : null,
        underTreatment: treatment ? { treatment: treatment.treatment, endsOn: treatment.endsOn } : null,
        lastKindledOn: kindled.find((s) => s.doeId === a.id)?.closedOn ?? null,
      };
    };
    return { today: clock.today, does: stock.filter((a) => a.sex === 'doe').map(present), bucks: stock.filter((a) => a.sex === 'buck').map(present) };
  });
}

/**
 * Records a service of a doe the farm keeps by a buck it keeps (its own, or one here on loan), on a date
 * that has happened, and plans its tasks (palpation, nest box, kindling with its window, the overdue
 * alert) under the farm's settings; her open rebreed or breed-back task is done by it. Refused with field
 * errors, nothing written, for a buck as the doe, a future date, a doe already carrying an open service;
 * a doe younger than her breed's first-breeding age or under treatment asks for confirmation first.
 */
export async function recordService(actor: SessionUser, input: ServiceCreateInput): Promise<ServiceDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'Service', { farmId }, 'That farm', 'Only members of the farm record services');
  return withTenant(actor, async (tx) => {
    if (input.id) {
      const existing = await ServiceRecord.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.farmId === farmId && !existing.deletedAt) return serviceDetail(tx, actor, existing);
      if (existing) throw AppError.idTaken();
    }
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const { settings } = await settingsOf(tx, farmId);
    const facts = await animalFactsOf(tx, actor.coopId, [input.doeId, input.buckId]);
    const doe = facts.get(input.doeId);
    const buck = facts.get(input.buckId);
    const errors: FieldMessages = {};
    const onFarm = (a: AnimalFacts | undefined, field: string, what: string) => {
      if (!a || a.isOutside) addMessage(errors, field, `That ${what} is not in your herd: choose one from the list`);
      else if (a.keepingFarmId !== farmId) addMessage(errors, field, `${a.name || a.tattoo} is not kept on your farm`);
      else if (a.disposition !== 'on_farm') addMessage(errors, field, `${a.name || a.tattoo} is no longer on a farm`);
    };
    onFarm(doe, 'doeId', 'doe');
    onFarm(buck, 'buckId', 'buck');
    if (input.doeId === input.buckId) addMessage(errors, 'buckId', 'The doe and the buck are the same animal');

    let checks: BreedingCheck[] = [];
    if (doe && buck && !errors.doeId && !errors.buckId) {
      // Locks her services so two members saving at once cannot both see "no open service".
      const hers = await ServiceRecord.findAll({ where: { doeId: doe.id }, order: [['servicedOn', 'DESC']], transaction: tx, lock: tx.LOCK.UPDATE });
      const open = hers.find((s) => s.status === 'open');
      const treatment = (await treatmentsCovering(tx, [doe.id], input.servicedOn)).get(doe.id);
      checks = checkService({
        serviceDate: input.servicedOn,
        today: clock.today,
        doe: { sex: doe.sex, birthDate: doe.birthDate, underTreatment: Boolean(treatment), firstBreedingMinDays: doe.firstBreedingMinDays },
        buck: { sex: buck.sex, birthDate: buck.birthDate, firstBreedingMinDays: buck.firstBreedingMinDays },
        openServiceDate: open?.servicedOn ?? null,
      });
      if (treatment) {
        checks = checks.map((c) => (c.code === 'under_treatment'
          ? { ...c, message: `She is under treatment (${treatment.treatment}) until ${treatment.endsOn}; ask the veterinarian before breeding her` }
          : c));
      }
      if (doe.birthDate && input.servicedOn < doe.birthDate) addMessage(errors, 'servicedOn', 'That is before the doe was born');
      const latest = hers.find((s) => s.status !== 'open');
      if (latest && (input.servicedOn <= latest.servicedOn || (latest.closedOn && input.servicedOn < latest.closedOn))) {
        const what = latest.status === 'kindled' ? `she kindled on ${latest.closedOn}` : `her service of ${latest.servicedOn} was closed on ${latest.closedOn}`;
        addMessage(errors, 'servicedOn', `A new service comes after her last one: ${what}`);
      }
    }
    for (const [field, messages] of Object.entries(toMessages(checks, 'error'))) for (const m of messages) addMessage(errors, field, m);
    refuseOrConfirm(errors, toMessages(checks, 'warning'), input.confirm);

    const service = await ServiceRecord.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId,
        farmId,
        doeId: doe!.id,
        buckId: buck!.id,
        servicedOn: input.servicedOn,
        notes: input.notes,
        warnings: checks.filter((c) => c.level === 'warning'),
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    await insertPlannedTasks(tx, { coopId: actor.coopId, farmId, sourceId: service.id, serviceId: service.id, animalId: doe!.id }, planFromService(input.servicedOn, settings));
    // Her rebreed (after an empty palpation) or breed-back task is done by this service.
    const settled = await openTasksOfAnimal(tx, doe!.id, ['rebreed', 'breed_back']);
    await markTasksDone(tx, settled.map((t) => t.id), input.servicedOn, actor.id);
    await recordChanges({ coopId: actor.coopId, tableName: 'services', recordId: service.id, actorUserId: actor.id, changes: { created: [null, input.servicedOn] } }, tx);
    announceAlmanac(tx, [farmId]);
    return serviceDetail(tx, actor, service);
  });
}

/** The farm's services, filtered, sorted and paged in SQL (open ones with where their kindling stands). */
export async function listServices(actor: SessionUser, q: ServiceListQuery): Promise<ServiceListDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Service', { farmId }, 'Those services');
  return withTenant(actor, async (tx) => {
    const status = q.status === 'open' ? { status: 'open' } : q.status === 'closed' ? { status: { [Op.ne]: 'open' } } : {};
    const where = { farmId, ...status, ...(q.doeId ? { doeId: q.doeId } : {}) };
    const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
    const offset = (q.page - 1) * q.pageSize;
    // Each row carries the count of all matching rows and its latest palpation, so neither is a statement of its own.
    const rows = await ServiceRecord.findAll({
      where,
      attributes: {
        include: [
          [literal('count(*) OVER ()'), 'matching'],
          [literal(`(SELECT p.result FROM palpations p WHERE p.service_id = "ServiceRecord".id AND p.review_state = 'accepted' AND p.result <> 'unsure' ORDER BY p.palpated_on DESC, p.created_at DESC LIMIT 1)`), 'lastPalpation'],
        ],
      },
      order: [['servicedOn', dir], ['createdAt', dir], ['id', dir]],
      limit: q.pageSize,
      offset,
      transaction: tx,
    });
    const extra = (r: ServiceRecord) => r.dataValues as unknown as { matching: string | number; lastPalpation: 'positive' | 'negative' | null };
    // A page past the end has no row to carry the count.
    const total = rows.length > 0 ? Number(extra(rows[0]!).matching) : offset === 0 ? 0 : await ServiceRecord.count({ where, transaction: tx });
    if (rows.length === 0) return { items: [], total, page: q.page, pageSize: q.pageSize };
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const { settings } = await settingsOf(tx, farmId);
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: rows.flatMap((r) => [r.doeId, r.buckId]) });
    const items = rows.map((r) =>
      presentServiceListItem(r, { ...ctx, kindlingStatus: statusOf(r, clock.today, settings), lastPalpation: extra(r).lastPalpation ?? null }));
    return { items, total, page: q.page, pageSize: q.pageSize };
  });
}

export async function getService(actor: SessionUser, serviceId: string): Promise<ServiceDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => serviceDetail(tx, actor, await serviceFor(tx, actor, serviceId, 'read')));
}

/**
 * What a palpation that counts does to its open service: its palpation task is done. A negative one
 * closes the service as empty, skips its nest box and kindling tasks with the reason, and plans the
 * rebreed under the farm's settings (day 1 after by default). An unsure one settles nothing.
 */
async function applyPalpationIn(tx: Transaction, actorId: string, service: ServiceRecord, palpatedOn: string, result: Palpation['result']): Promise<void> {
  if (result === 'unsure') return;
  const { settings } = await settingsOf(tx, service.farmId);
  const tasks = await tasksOf(tx, { serviceId: service.id });
  await markTasksDone(tx, tasks.filter((t) => t.kind === 'palpation').map((t) => t.id), palpatedOn, actorId);
  if (result === 'negative') {
    const plan = planAfterPalpation('negative', palpatedOn, settings);
    await skipTasks(tx, tasks.filter((t) => plan.skipKinds.includes(t.kind)).map((t) => ({ id: t.id, reason: plan.skipReason! })));
    await insertPlannedTasks(tx, { coopId: service.coopId, farmId: service.farmId, sourceId: service.id, serviceId: service.id, animalId: service.doeId }, plan.tasks);
    service.set({ status: 'empty', closedOn: palpatedOn, closeReason: plan.skipReason });
    await service.save({ transaction: tx });
  }
}

/** Records a palpation of an open service by a member of the farm; it counts at once. */
export async function recordPalpation(actor: SessionUser, serviceId: string, input: PalpationCreateInput): Promise<ServiceDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => {
    const service = await serviceFor(tx, actor, serviceId, 'update');
    if (service.status !== 'open') throw new AppError(ErrorCode.conflict, 409, `That service is closed (${service.status}); a palpation belongs to an open service`);
    const clock = await farmClockOf(tx, actor.coopId, service.farmId);
    const checks = checkPalpationDate(service.servicedOn, input.palpatedOn, clock.today);
    refuseOrConfirm(toMessages(checks, 'error'), toMessages(checks, 'warning'), input.confirm);

    await Palpation.create(
      { coopId: actor.coopId, farmId: service.farmId, serviceId, palpatedOn: input.palpatedOn, result: input.result, notes: input.notes, recordedBy: actor.id },
      { transaction: tx },
    );
    await applyPalpationIn(tx, actor.id, service, input.palpatedOn, input.result);
    await recordChanges({ coopId: actor.coopId, tableName: 'services', recordId: service.id, actorUserId: actor.id, changes: { palpation: [null, `${input.result} on ${input.palpatedOn}`] } }, tx);
    announceAlmanac(tx, [service.farmId]);
    return serviceDetail(tx, actor, service);
  });
}

/** A palpation as the mentor's queue and the apprentice's log show it. */
export interface PalpationFacts {
  id: string;
  serviceId: string;
  farmId: string;
  doeId: string;
  palpatedOn: string;
  result: Palpation['result'];
  reviewState: Palpation['reviewState'];
  version: number;
}

/**
 * An apprentice's palpation of a doe of her mentor's farm, inside the caller's transaction: it goes on the
 * doe's open service pending, so it changes nothing (no task done, no service closed) until accepted.
 */
export async function recordPendingPalpationIn(
  tx: Transaction, actor: SessionUser, input: { farmId: string; doeId: string; palpatedOn: string; result: Palpation['result']; notes: string },
): Promise<string> {
  const service = await ServiceRecord.findOne({ where: { coopId: actor.coopId, farmId: input.farmId, doeId: input.doeId, status: 'open' }, transaction: tx });
  if (!service) throw AppError.validation({ palpation: ['That doe has no open service on your mentor\'s farm to palpate'] });
  ensureCan(actor, 'read', 'Service', { farmId: service.farmId }, 'That service');
  const clock = await farmClockOf(tx, actor.coopId, service.farmId);
  const errors = toMessages(checkPalpationDate(service.servicedOn, input.palpatedOn, clock.today), 'error');
  if (Object.keys(errors).length > 0) throw AppError.validation({ palpation: Object.values(errors).flat() });
  const palpation = await Palpation.create(
    {
      coopId: actor.coopId, farmId: service.farmId, serviceId: service.id, palpatedOn: input.palpatedOn, result: input.result, notes: input.notes,
      recordedBy: actor.id, reviewState: 'pending',
    },
    { transaction: tx },
  );
  announceAlmanac(tx, [service.farmId]);
  return palpation.id;
}

export async function palpationFactsOf(tx: Transaction, coopId: string, ids: string[]): Promise<Map<string, PalpationFacts>> {
  if (ids.length === 0) return new Map();
  const rows = await Palpation.findAll({ where: { coopId, id: { [Op.in]: [...new Set(ids)] } }, transaction: tx });
  const services = await ServiceRecord.findAll({ where: { id: { [Op.in]: rows.map((r) => r.serviceId) } }, attributes: ['id', 'doeId'], transaction: tx });
  const doeOf = new Map(services.map((s) => [s.id, s.doeId]));
  return new Map(rows.map((r) => [r.id, {
    id: r.id, serviceId: r.serviceId, farmId: r.farmId, doeId: doeOf.get(r.serviceId)!, palpatedOn: r.palpatedOn, result: r.result, reviewState: r.reviewState, version: r.version,
  }]));
}

/**
 * The mentor's decision on a pending palpation, inside the caller's transaction (the caller has checked
 * she is the apprentice's mentor). Accepted, it takes effect on its service in this same transaction;
 * a service closed meanwhile (kindled, closed as missed) refuses it, to be returned instead.
 */
export async function reviewPalpationIn(tx: Transaction, actor: SessionUser, palpationId: string, input: { decision: 'accepted' | 'returned'; comment?: string }): Promise<void> {
  const palpation = await Palpation.findOne({ where: { id: palpationId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!palpation) throw AppError.notFound('That palpation');
  if (palpation.reviewState !== 'pending') throw new AppError(ErrorCode.conflict, 409, 'That palpation was already reviewed');
  if (input.decision === 'accepted') {
    const service = await ServiceRecord.findOne({ where: { id: palpation.serviceId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!service) throw AppError.notFound('That service');
    if (service.status !== 'open') {
      throw new AppError(ErrorCode.conflict, 409, `That service is closed (${service.status}) since; return the palpation instead`);
    }
    await applyPalpationIn(tx, actor.id, service, palpation.palpatedOn, palpation.result);
    await recordChanges({ coopId: actor.coopId, tableName: 'services', recordId: service.id, actorUserId: actor.id, changes: { palpation: [null, `${palpation.result} on ${palpation.palpatedOn}`] } }, tx);
  }
  palpation.set({ reviewState: input.decision, reviewedBy: actor.id, reviewedAt: new Date(), reviewComment: input.comment || null, version: palpation.version + 1 });
  await palpation.save({ transaction: tx });
  announceAlmanac(tx, [palpation.farmId]);
}

/** Closes an open service with no kindling (she missed): its open tasks are skipped and the rebreed planned. */
export async function closeService(actor: SessionUser, serviceId: string, input: ServiceClosureInput): Promise<ServiceDto> {
  farmOf(actor);
  return withTenant(actor, async (tx) => {
    const service = await serviceFor(tx, actor, serviceId, 'update');
    if (service.version !== input.version) throw AppError.staleVersion();
    if (service.status !== 'open') throw new AppError(ErrorCode.conflict, 409, 'That service is already closed');
    const clock = await farmClockOf(tx, actor.coopId, service.farmId);
    const errors: FieldMessages = {};
    if (input.closedOn > clock.today) addMessage(errors, 'closedOn', `${input.closedOn} is in the future (today is ${clock.today})`);
    if (input.closedOn < service.servicedOn) addMessage(errors, 'closedOn', `That is before the service on ${service.servicedOn}`);
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const { settings } = await settingsOf(tx, service.farmId);
    const reason = `Service closed as missed: ${input.reason}`;
    const tasks = await tasksOf(tx, { serviceId });
    await skipTasks(tx, tasks.filter((t) => t.state === 'open' || t.state === 'moved').map((t) => ({ id: t.id, reason })));
    const plan = planAfterPalpation('negative', input.closedOn, settings);
    await insertPlannedTasks(tx, { coopId: actor.coopId, farmId: service.farmId, sourceId: service.id, serviceId: service.id, animalId: service.doeId }, plan.tasks);
    service.set({ status: 'missed', closedOn: input.closedOn, closeReason: input.reason });
    await service.save({ transaction: tx });
    await recordChanges({ coopId: actor.coopId, tableName: 'services', recordId: service.id, actorUserId: actor.id, changes: { status: ['open', 'missed'] } }, tx);
    announceAlmanac(tx, [service.farmId]);
    return serviceDetail(tx, actor, service);
  });
}

// ---------------------------------------------------------------------------------------------
// For litters, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

/**
 * The service a kindling comes from, locked: the actor's farm's, not yet kindled. A palpation can be
 * wrong, so a service closed as empty or missed may still be kindled (the 40-day limit applies).
 */
export async function serviceForKindling(tx: Transaction, actor: SessionUser, serviceId: string): Promise<ServiceFacts> {
  const service = await ServiceRecord.findOne({ where: { id: serviceId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!service || service.farmId !== actor.farmId) throw AppError.validation({ serviceId: ["That service is not on your farm's record: choose one of your does' open services"] });
  if (service.status === 'kindled') throw AppError.validation({ serviceId: ['That service already has its litter'] });
  return { id: service.id, coopId: service.coopId, farmId: service.farmId, doeId: service.doeId, buckId: service.buckId, servicedOn: service.servicedOn, status: service.status };
}

/** Services by id (for a litter's page). */
export async function serviceDatesOf(tx: Transaction, ids: string[]): Promise<Map<string, string>> {
  const rows = await ServiceRecord.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'servicedOn'], transaction: tx });
  return new Map(rows.map((r) => [r.id, r.servicedOn]));
}

/**
 * A kindling closes its service: the kindling task is done, the overdue alert and an undone palpation
 * skipped, the nest box skipped if she kindled before it was due; a rebreed planned after an empty
 * palpation is skipped too (she kindled after all).
 */
export async function settleServiceOnKindling(tx: Transaction, actor: SessionUser, serviceId: string, litterId: string, kindledOn: string): Promise<void> {
  const service = await ServiceRecord.findByPk(serviceId, { transaction: tx, lock: tx.LOCK.UPDATE });
  if (!service) throw AppError.notFound('That service');
  const before = service.status;
  const tasks = await tasksOf(tx, { serviceId });
  const settled = settleServiceTasksOnKindling(tasks.map(toTaskRecord), kindledOn);
  await markTasksDone(tx, settled.done, kindledOn, actor.id);
  const day = daysBetween(service.servicedOn, kindledOn);
  await skipTasks(tx, [
    ...settled.skipped,
    ...tasks.filter((t) => t.kind === 'rebreed' && (t.state === 'open' || t.state === 'moved')).map((t) => ({ id: t.id, reason: `She kindled on day ${day} after all` })),
  ]);
  service.set({ status: 'kindled', closedOn: kindledOn, closeReason: null, litterId });
  await service.save({ transaction: tx });
  await recordChanges({ coopId: actor.coopId, tableName: 'services', recordId: service.id, actorUserId: actor.id, changes: { status: [before, 'kindled'] } }, tx);
  announceAlmanac(tx, [service.farmId]);
}

// ---------------------------------------------------------------------------------------------
// For performance, inside the caller's transaction
// ---------------------------------------------------------------------------------------------

/** A service with how it turned out (shared serviceOutcome), for conception rates and misses in a row. */
export interface ServiceOutcomeFacts {
  id: string;
  doeId: string;
  buckId: string;
  servicedOn: string;
  status: ServiceRecord['status'];
  litterId: string | null;
  outcome: ServiceOutcome;
}

/**
 * Every service of a farm with its outcome on the farm's today: kindled, missed (palpated empty, closed
 * as missed, or the kindling window passed) or still open. One query for the services.
 */
export async function serviceOutcomesOfFarm(tx: Transaction, coopId: string, farmId: string, today: string): Promise<ServiceOutcomeFacts[]> {
  const { settings } = await settingsOf(tx, farmId);
  const rows = await ServiceRecord.findAll({
    where: { coopId, farmId }, attributes: ['id', 'doeId', 'buckId', 'servicedOn', 'status', 'closedOn', 'litterId'],
    order: [['servicedOn', 'ASC'], ['createdAt', 'ASC']], raw: true, transaction: tx,
  });
  return serviceOutcomeFactsOf(rows, today, settings);
}

/** A service row with the columns its outcome is worked out from. */
export type ServiceOutcomeRow = Pick<ServiceRecord, 'id' | 'doeId' | 'buckId' | 'servicedOn' | 'status' | 'closedOn' | 'litterId'>;

/** How each service turned out, from rows a caller read in a statement of its own (the performance tables). */
export function serviceOutcomeFactsOf(rows: ServiceOutcomeRow[], today: string, settings: CycleSettings): ServiceOutcomeFacts[] {
  return rows.map((r) => ({
    id: r.id,
    doeId: r.doeId,
    buckId: r.buckId,
    servicedOn: r.servicedOn,
    status: r.status,
    litterId: r.litterId,
    outcome: serviceOutcome(
      { servicedOn: r.servicedOn, kindledOn: r.status === 'kindled' ? r.closedOn ?? r.servicedOn : null, palpation: r.status === 'empty' ? 'negative' : null, closedAsMissed: r.status === 'missed' },
      today, settings,
    ),
  }));
}
