import { Op, type Transaction, type WhereOptions } from 'sequelize';
import {
  addDays, daysBetween, RealtimeEvent, rooms,
  type TreatmentCreateInput, type TreatmentDto, type WithdrawalDto, type WithdrawalQuery, type WithdrawalStateDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf } from '../animals/animal-facts.service';
import { port } from '../../lib/port';
import { addMessage, ensureCan, farmOf, type FieldMessages } from '../farms/farm-access';
import { announceAlmanac } from './almanac-events.service';
import { farmClockOf } from '../farms/farm-clock';
import { presentAnimalRef, presentTreatment } from './almanac.presenter';
import { presentContextOf } from './tasks.service';
import { Treatment } from './treatment.model';

/** The treatments covering a date (started by it, withdrawal not yet over), by animal. */
export async function treatmentsCovering(tx: Transaction, animalIds: string[], date: string): Promise<Map<string, Treatment>> {
  if (animalIds.length === 0) return new Map();
  const rows = await Treatment.findAll({
    where: { animalId: { [Op.in]: animalIds }, startedOn: { [Op.lte]: date }, endsOn: { [Op.gte]: date } },
    order: [['endsOn', 'DESC']],
    transaction: tx,
  });
  const byAnimal = new Map<string, Treatment>();
  for (const row of rows) if (row.animalId && !byAnimal.has(row.animalId)) byAnimal.set(row.animalId, row);
  return byAnimal;
}

export interface WithdrawalFacts {
  treatmentId: string;
  treatment: string;
  veterinarian: string;
  /** The last day under withdrawal. */
  withdrawalEndsOn: string;
}

/**
 * The withdrawals covering a date, by animal and by grow-out group (the longest one of each): a
 * treatment started by then whose withdrawal, set by the veterinarian, is not over. An animal or group
 * under withdrawal is neither marked for processing nor processed; breeding is not blocked (a warning).
 */
export async function withdrawalsCovering(
  tx: Transaction,
  coopId: string,
  subjects: { animalIds?: string[]; groupIds?: string[] },
  date: string,
): Promise<{ animals: Map<string, WithdrawalFacts>; groups: Map<string, WithdrawalFacts> }> {
  const animals = new Map<string, WithdrawalFacts>();
  const groups = new Map<string, WithdrawalFacts>();
  const animalIds = subjects.animalIds ?? [];
  const groupIds = subjects.groupIds ?? [];
  if (animalIds.length === 0 && groupIds.length === 0) return { animals, groups };
  const which: WhereOptions<Treatment>[] = [];
  if (animalIds.length > 0) which.push({ animalId: { [Op.in]: animalIds } });
  if (groupIds.length > 0) which.push({ groupId: { [Op.in]: groupIds } });
  const rows = await Treatment.findAll({
    where: { coopId, startedOn: { [Op.lte]: date }, endsOn: { [Op.gte]: date }, [Op.or]: which },
    order: [['endsOn', 'DESC'], ['createdAt', 'ASC']],
    transaction: tx,
  });
  for (const row of rows) {
    const facts = { treatmentId: row.id, treatment: row.treatment, veterinarian: row.veterinarian, withdrawalEndsOn: row.endsOn };
    if (row.animalId && !animals.has(row.animalId)) animals.set(row.animalId, facts);
    if (row.groupId && !groups.has(row.groupId)) groups.set(row.groupId, facts);
  }
  return { animals, groups };
}

function announceHealth(tx: Transaction, farmId: string): void {
  announceAlmanac(tx, [farmId]);
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.healthChanged, { farmId }));
}

/**
 * The farm's grow-out groups by id, named. Grow-out reads the Almanac (settings, weigh-in tasks), so the
 * Almanac cannot import it; the composition root plugs grow-out's groups in.
 */
export const groupNamesOfFarm = port<(tx: Transaction, coopId: string, farmId: string) => Promise<Map<string, string>>>('farm grow-out group names');

async function groupNamesOf(tx: Transaction, coopId: string, farmId: string): Promise<Map<string, string>> {
  return groupNamesOfFarm(tx, coopId, farmId);
}

/**
 * Records a treatment of an animal the farm keeps or of one of its grow-out groups, with the dose, the
 * route, who prescribed it and the withdrawal the veterinarian set (an end date, or days after the last
 * dose; 0 days when there is none). No drugs are approved for rabbits in the US: treatment is
 * extralabel, under a veterinarian. Sent again with the same id, it is recorded once.
 */
export async function recordTreatment(actor: SessionUser, input: TreatmentCreateInput): Promise<TreatmentDto> {
  return withTenant(actor, (tx) => recordTreatmentIn(tx, actor, input));
}

/** recordTreatment inside the caller's transaction (the demo loader). */
export async function recordTreatmentIn(tx: Transaction, actor: SessionUser, input: TreatmentCreateInput): Promise<TreatmentDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'Treatment', { farmId }, 'That animal', 'Only members of the farm record treatments');
  const clock = await farmClockOf(tx, actor.coopId, farmId);
  const groupNames = await groupNamesOf(tx, actor.coopId, farmId);
  if (input.id) {
    const existing = await Treatment.findOne({ where: { id: input.id, coopId: actor.coopId }, transaction: tx });
    if (existing) {
      if (existing.farmId !== farmId) throw AppError.idTaken();
      const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: [existing.animalId], userIds: [existing.recordedBy] });
      return presentTreatment(existing, ctx, groupNames);
    }
  }
  const errors: FieldMessages = {};
  let birthDate: string | null = null;
  if (input.animalId) {
    const animal = (await animalFactsOf(tx, actor.coopId, [input.animalId])).get(input.animalId);
    if (!animal || animal.isOutside || animal.keepingFarmId !== farmId) addMessage(errors, 'animalId', 'Choose an animal your farm keeps');
    birthDate = animal?.birthDate ?? null;
  }
  if (input.groupId && !groupNames.has(input.groupId)) addMessage(errors, 'groupId', 'Choose a grow-out group of your farm');
  if (input.startedOn > clock.today) addMessage(errors, 'startedOn', `The treatment starts on ${input.startedOn}, a date in the future (today is ${clock.today})`);
  if (birthDate && input.startedOn < birthDate) addMessage(errors, 'startedOn', 'That is before the animal was born');
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);

  const endsOn = input.withdrawalEndsOn ?? addDays(input.lastDoseOn, input.withdrawalDays!);
  const row = await Treatment.create(
    {
      ...(input.id ? { id: input.id } : {}),
      coopId: actor.coopId, farmId, recordedBy: actor.id,
      animalId: input.animalId ?? null, groupId: input.groupId ?? null,
      treatment: input.treatment, dose: input.dose, route: input.route, veterinarian: input.veterinarian,
      startedOn: input.startedOn, lastDoseOn: input.lastDoseOn, endsOn, withdrawalDays: daysBetween(input.lastDoseOn, endsOn),
      notes: input.notes,
    },
    { transaction: tx },
  );
  await recordChanges({ coopId: actor.coopId, tableName: 'treatments', recordId: row.id, actorUserId: actor.id, changes: { created: [null, input.treatment] } }, tx);
  announceHealth(tx, farmId);
  const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: [row.animalId], userIds: [actor.id] });
  return presentTreatment(row, ctx, groupNames);
}

/** The farm's treatments, latest first (of one animal or group, if asked). */
export async function listTreatments(actor: SessionUser, filter: { animalId?: string; groupId?: string } = {}): Promise<TreatmentDto[]> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Treatment', { farmId }, 'Those treatments');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const rows = await Treatment.findAll({
      where: { farmId, ...(filter.animalId ? { animalId: filter.animalId } : {}), ...(filter.groupId ? { groupId: filter.groupId } : {}) },
      order: [['startedOn', 'DESC'], ['createdAt', 'DESC']],
      limit: 200,
      transaction: tx,
    });
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: rows.map((r) => r.animalId), userIds: rows.map((r) => r.recordedBy) });
    const groupNames = await groupNamesOf(tx, actor.coopId, farmId);
    return rows.map((r) => presentTreatment(r, ctx, groupNames));
  });
}

/**
 * Withdrawals covering today on the farm's clock: of one animal the farm keeps or one of its groups
 * (an id of another farm's is not there: 404), or all of the farm's, the longest first.
 */
export async function listWithdrawals(actor: SessionUser, query: WithdrawalQuery): Promise<WithdrawalStateDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Treatment', { farmId }, 'Those withdrawals');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const groupNames = await groupNamesOf(tx, actor.coopId, farmId);
    if (query.groupId && !groupNames.has(query.groupId)) throw AppError.notFound('That group');
    if (query.animalId) {
      const animal = (await animalFactsOf(tx, actor.coopId, [query.animalId])).get(query.animalId);
      if (!animal || animal.isOutside || (animal.keepingFarmId !== farmId && animal.owningFarmId !== farmId)) throw AppError.notFound('That animal');
    }
    const where: WhereOptions<Treatment> = { farmId, startedOn: { [Op.lte]: clock.today }, endsOn: { [Op.gte]: clock.today } };
    if (query.animalId) Object.assign(where, { animalId: query.animalId });
    if (query.groupId) Object.assign(where, { groupId: query.groupId });
    const rows = await Treatment.findAll({ where, order: [['endsOn', 'DESC'], ['createdAt', 'ASC']], transaction: tx });
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: rows.map((r) => r.animalId) });
    const withdrawals: WithdrawalDto[] = rows.map((r) => ({
      treatmentId: r.id,
      animal: r.animalId ? presentAnimalRef(r.animalId, ctx) : null,
      group: r.groupId ? { id: r.groupId, name: groupNames.get(r.groupId) ?? 'A grow-out group' } : null,
      treatment: r.treatment,
      veterinarian: r.veterinarian,
      withdrawalEndsOn: r.endsOn,
      clearFrom: addDays(r.endsOn, 1),
    }));
    return { today: clock.today, withdrawals };
  });
}
