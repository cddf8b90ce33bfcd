import { ForbiddenError } from '@casl/ability';
import { col, fn, Op, where, type Transaction } from 'sequelize';
import {
  defineAbilityFor, farmProfileUpdateSchema, RealtimeEvent, rooms, subjectOf, type FarmCoordinatesInput, type FarmDto, type FarmProfileInput,
} from '@burrowline/shared';
import { accessibleWhere } from '../../db/scope';
import { withTenant } from '../../db/tenant';
import { onceInTransaction } from '../../db/transaction-memo';
import { coopDirectoryOf, forgetCoopDirectory } from '../../db/coop-directory';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import type { SessionUser } from '../../lib/session-user';
import { recordChanges } from '../audit/audit.service';
import { Farm } from './farm.model';
import { presentFarm } from './farms.presenter';

const withMembers = { association: 'members', attributes: ['id', 'name', 'role', 'disabledAt'] };

/** The co-op's directory: every farm profile of the actor's co-op. */
export async function listFarms(actor: SessionUser): Promise<FarmDto[]> {
  const ability = defineAbilityFor(actor);
  return withTenant(actor, async (tx) => {
    const farms = await Farm.findAll({
      where: accessibleWhere(ability, 'read', 'Farm'),
      include: [withMembers],
      order: [['name', 'ASC']],
      transaction: tx,
    });
    return farms.map(presentFarm);
  });
}

/** One farm profile; another co-op's farm answers 404 (its existence does not leak). */
export async function getFarm(actor: SessionUser, farmId: string): Promise<FarmDto> {
  return withTenant(actor, async (tx) => {
    const farm = await Farm.findOne({ where: { id: farmId, coopId: actor.coopId }, include: [withMembers], transaction: tx });
    if (!farm || !defineAbilityFor(actor).can('read', subjectOf('Farm', { id: farm.id, coopId: farm.coopId }))) {
      throw AppError.notFound('That farm');
    }
    return presentFarm(farm);
  });
}

/**
 * Edits a farm's profile. Only the farm's own members may; the edit must be made from the current
 * version (else 409), is kept in the record's history and is announced live to the co-op.
 */
/** The body is read only once the actor may edit the farm, so someone who may not learns nothing from a 400. */
export async function updateFarmProfile(actor: SessionUser, farmId: string, body: unknown): Promise<FarmDto> {
  return withTenant(actor, async (tx) => {
    // Row lock first (FOR UPDATE cannot cover the outer join), members after.
    const farm = await Farm.findOne({ where: { id: farmId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!farm) throw AppError.notFound('That farm');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('Farm', { id: farm.id, coopId: farm.coopId }));
    const input = farmProfileUpdateSchema.parse(body);
    if (farm.version !== input.version) throw AppError.staleVersion();

    const { version: _version, ...fields } = input;
    const changes: Record<string, [unknown, unknown]> = {};
    for (const [key, value] of Object.entries(fields) as [keyof typeof fields, unknown][]) {
      const before = farm.get(key);
      if (JSON.stringify(before) !== JSON.stringify(value)) changes[key] = [before, value];
    }
    if (Object.keys(changes).length > 0) {
      farm.set(fields);
      await farm.save({ transaction: tx });
      forgetCoopDirectory(tx, actor.coopId);
      await recordChanges({ coopId: actor.coopId, tableName: 'farms', recordId: farm.id, actorUserId: actor.id, changes }, tx);
      tx.afterCommit(() => publish(rooms.coop(actor.coopId), RealtimeEvent.farmUpdated, { farmId: farm.id }));
    }
    await farm.reload({ include: [withMembers], transaction: tx });
    return presentFarm(farm);
  });
}

/**
 * Sets a farm's coordinates (for distances in the Stud Share finder) and whether its litters count in
 * sires' get's records. Only the farm's own members; kept in the record's history, announced to the co-op.
 */
export async function setFarmCoordinates(actor: SessionUser, farmId: string, input: FarmCoordinatesInput): Promise<FarmDto> {
  return withTenant(actor, async (tx) => {
    const farm = await Farm.findOne({ where: { id: farmId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!farm) throw AppError.notFound('That farm');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('update', subjectOf('Farm', { id: farm.id, coopId: farm.coopId }));
    const next = { latitude: input.latitude, longitude: input.longitude, sharesGetRecords: input.sharesGetRecords ?? farm.sharesGetRecords };
    const changes: Record<string, [unknown, unknown]> = {};
    for (const key of ['latitude', 'longitude', 'sharesGetRecords'] as const) {
      if (farm.get(key) !== next[key]) changes[key] = [farm.get(key), next[key]];
    }
    if (Object.keys(changes).length > 0) {
      farm.set(next);
      await farm.save({ transaction: tx });
      await recordChanges({ coopId: actor.coopId, tableName: 'farms', recordId: farm.id, actorUserId: actor.id, changes }, tx);
      tx.afterCommit(() => publish(rooms.coop(actor.coopId), RealtimeEvent.farmUpdated, { farmId: farm.id }));
    }
    await farm.reload({ include: [withMembers], transaction: tx });
    return presentFarm(farm);
  });
}

/** Coordinates and get's-record sharing of the co-op's farms, inside the caller's transaction. */
export async function farmStudFactsOf(
  coopId: string,
  tx: Transaction,
): Promise<Map<string, { latitude: number | null; longitude: number | null; sharesGetRecords: boolean }>> {
  return onceInTransaction(tx, `farm-stud-facts:${coopId}`, async () => {
    const farms = await Farm.findAll({ where: { coopId }, attributes: ['id', 'latitude', 'longitude', 'sharesGetRecords'], transaction: tx, raw: true });
    return new Map(farms.map((f) => [f.id, { latitude: f.latitude ?? null, longitude: f.longitude ?? null, sharesGetRecords: f.sharesGetRecords }]));
  });
}

/** Creates a farm inside the caller's tenant transaction (co-op set-up, admission of a member). */
export async function createFarm(coopId: string, profile: FarmProfileInput, tx: Transaction): Promise<Farm> {
  forgetCoopDirectory(tx, coopId);
  return Farm.create({ coopId, ...profile }, { transaction: tx });
}

/** Whether the co-op already has a farm of that name (names are unique per co-op, ignoring case). */
export async function isFarmNameTaken(coopId: string, name: string, tx: Transaction): Promise<boolean> {
  const count = await Farm.count({ where: { coopId, [Op.and]: [where(fn('lower', col('name')), name.trim().toLowerCase())] }, transaction: tx });
  return count > 0;
}

/** Farms of the co-op by id, as `{ id, name }`; another co-op's farm is simply not in the answer. */
export async function findFarmRefs(coopId: string, farmIds: string[], tx: Transaction): Promise<Map<string, { id: string; name: string }>> {
  if (farmIds.length === 0) return new Map();
  const farms = await Farm.findAll({ where: { id: { [Op.in]: farmIds }, coopId }, attributes: ['id', 'name'], transaction: tx });
  return new Map(farms.map((farm) => [farm.id, { id: farm.id, name: farm.name }]));
}

/** One farm of the actor's co-op by id, as `{ id, name }`, or null. */
export async function findFarmRef(coopId: string, farmId: string, tx: Transaction): Promise<{ id: string; name: string } | null> {
  return (await findFarmRefs(coopId, [farmId], tx)).get(farmId) ?? null;
}

/** The co-op's farms with their names, clocks and units, read once per transaction (farm-clock.ts reads it too). */
export async function farmDirectoryOf(
  coopId: string,
  tx: Transaction,
): Promise<Map<string, { id: string; name: string; timeZone: string; weightUnit: Farm['weightUnit'] }>> {
  // Read once per transaction with the breeds: most requests read it, to present farms or to know the farm's today.
  const { farms } = await coopDirectoryOf(tx, coopId);
  return new Map(farms.map((f) => [f.id, f as { id: string; name: string; timeZone: string; weightUnit: Farm['weightUnit'] }]));
}
