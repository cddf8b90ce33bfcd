import { Op, type Transaction } from 'sequelize';
import { type TreatmentCreateInput, type TreatmentDto } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../http/passport';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { animalFactsOf } from '../animals/animals.service';
import { addMessage, ensureCan, farmOf, type FieldMessages } from './almanac-access';
import { announceAlmanac, farmClockOf } from './almanac-context';
import { presentTreatment } from './almanac.presenter';
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
  for (const row of rows) if (!byAnimal.has(row.animalId)) byAnimal.set(row.animalId, row);
  return byAnimal;
}

/**
 * Records a treatment of an animal the farm keeps, to the end of the withdrawal the veterinarian set.
 * No drugs are approved for rabbits in the US: treatment is extralabel, under a veterinarian.
 */
export async function recordTreatment(actor: SessionUser, input: TreatmentCreateInput): Promise<TreatmentDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'Treatment', { farmId }, 'That animal', 'Only members of the farm record treatments');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const animal = (await animalFactsOf(tx, actor.coopId, [input.animalId])).get(input.animalId);
    const errors: FieldMessages = {};
    if (!animal || animal.isOutside || animal.keepingFarmId !== farmId) addMessage(errors, 'animalId', 'Choose an animal your farm keeps');
    if (input.startedOn > clock.today) addMessage(errors, 'startedOn', `The treatment starts on ${input.startedOn}, a date in the future (today is ${clock.today})`);
    if (animal?.birthDate && input.startedOn < animal.birthDate) addMessage(errors, 'startedOn', 'That is before the animal was born');
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    const row = await Treatment.create({ coopId: actor.coopId, farmId, recordedBy: actor.id, ...input }, { transaction: tx });
    await recordChanges({ coopId: actor.coopId, tableName: 'treatments', recordId: row.id, actorUserId: actor.id, changes: { created: [null, input.treatment] } }, tx);
    announceAlmanac(tx, [farmId]);
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: [row.animalId], userIds: [actor.id] });
    return presentTreatment(row, ctx);
  });
}

/** The farm's treatments, latest first (of one animal, if asked). */
export async function listTreatments(actor: SessionUser, animalId?: string): Promise<TreatmentDto[]> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'Treatment', { farmId }, 'Those treatments');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const rows = await Treatment.findAll({
      where: { farmId, ...(animalId ? { animalId } : {}) },
      order: [['startedOn', 'DESC'], ['createdAt', 'DESC']],
      limit: 200,
      transaction: tx,
    });
    const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: rows.map((r) => r.animalId), userIds: rows.map((r) => r.recordedBy) });
    return rows.map((r) => presentTreatment(r, ctx));
  });
}
