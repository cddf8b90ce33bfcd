import { col, fn, Op, where, type Transaction } from 'sequelize';
import {
  ErrorCode, RealtimeEvent, rooms, type HousingPlacementDto, type HousingUnitCreateInput, type HousingUnitDto,
  type PlacementCreateInput, type PlacementEndInput,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { publish } from '../../lib/realtime';
import { addMessage, ensureCan, farmOf, type FieldMessages } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { presentAnimalRef } from '../animals/animal-facts.service';
import { setAnimalHutchIn } from '../animals/animal-edits.service';
import { presentContextOf } from '../almanac/tasks.service';
import { HousingPlacement } from './housing-placement.model';
import { HousingUnit } from './housing-unit.model';
import { Litter } from './litter.model';

function announceHousing(tx: Transaction, farmId: string) {
  tx.afterCommit(() => publish(rooms.farm(farmId), RealtimeEvent.almanacChanged, { farmId }));
}

async function present(tx: Transaction, coopId: string, today: string, units: HousingUnit[]): Promise<HousingUnitDto[]> {
  const placements = await HousingPlacement.findAll({
    where: { unitId: { [Op.in]: units.map((u) => u.id) }, endedOn: { [Op.is]: null } },
    order: [['placedOn', 'ASC']],
    transaction: tx,
  });
  const litters = await Litter.findAll({ where: { id: { [Op.in]: placements.map((p) => p.litterId).filter((id): id is string => Boolean(id)) } }, transaction: tx });
  const ctx = await presentContextOf(tx, coopId, today, { animalIds: [...placements.map((p) => p.animalId), ...litters.map((l) => l.damId)] });
  const placementDto = (p: HousingPlacement): HousingPlacementDto => {
    const litter = litters.find((l) => l.id === p.litterId);
    return {
      id: p.id,
      unitId: p.unitId,
      animal: p.animalId ? presentAnimalRef(p.animalId, ctx) : null,
      litter: litter ? { id: litter.id, dam: presentAnimalRef(litter.damId, ctx), kindledOn: litter.kindledOn } : null,
      placedOn: p.placedOn,
      endedOn: p.endedOn,
      note: p.note,
    };
  };
  // An animal sold, lent away, processed or dead no longer lives here, whatever its last placement says.
  const livesHere = (p: HousingPlacement) => {
    if (!p.animalId) return true;
    const a = ctx.animals.get(p.animalId);
    return Boolean(a && a.keepingFarmId === p.farmId && a.disposition === 'on_farm');
  };
  return units.map((u) => ({
    id: u.id,
    farmId: u.farmId,
    name: u.name,
    kind: u.kind,
    capacity: u.capacity,
    notes: u.notes,
    current: placements.filter((p) => p.unitId === u.id && livesHere(p)).map(placementDto),
    version: u.version,
  }));
}

/** The farm's hutches and pens with who is in each now. */
export async function listHousingUnits(actor: SessionUser): Promise<HousingUnitDto[]> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'HousingUnit', { farmId }, 'That housing');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const units = await HousingUnit.findAll({ where: { farmId }, order: [['name', 'ASC']], transaction: tx });
    return present(tx, actor.coopId, clock.today, units);
  });
}

export async function createHousingUnit(actor: SessionUser, input: HousingUnitCreateInput): Promise<HousingUnitDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'HousingUnit', { farmId }, 'That housing', 'Only members of the farm set up its hutches and pens');
  return withTenant(actor, async (tx) => {
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const taken = await HousingUnit.count({ where: { farmId, [Op.and]: [where(fn('lower', col('name')), input.name.toLowerCase())] }, transaction: tx });
    if (taken > 0) throw AppError.validation({ name: [`The farm already has a ${input.name}`] });
    const unit = await HousingUnit.create({ coopId: actor.coopId, farmId, ...input }, { transaction: tx });
    announceHousing(tx, farmId);
    return (await present(tx, actor.coopId, clock.today, [unit]))[0]!;
  });
}

/**
 * Puts an animal the farm keeps, or one of its litters, into a hutch or pen from a date; its previous
 * placement ends that day (one current place each).
 */
export async function placeInUnit(actor: SessionUser, unitId: string, input: PlacementCreateInput): Promise<HousingUnitDto> {
  const farmId = farmOf(actor);
  return withTenant(actor, async (tx) => {
    const unit = await HousingUnit.findOne({ where: { id: unitId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!unit || unit.farmId !== farmId) throw AppError.notFound('That hutch or pen');
    ensureCan(actor, 'update', 'HousingUnit', { farmId }, 'That hutch or pen', 'Only members of the farm move animals between hutches');
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    const errors: FieldMessages = {};
    if (input.placedOn > clock.today) addMessage(errors, 'placedOn', `${input.placedOn} is in the future (today is ${clock.today})`);
    if (input.animalId) {
      const ctx = await presentContextOf(tx, actor.coopId, clock.today, { animalIds: [input.animalId] });
      const animal = ctx.animals.get(input.animalId);
      if (!animal || animal.isOutside || animal.keepingFarmId !== farmId || animal.disposition !== 'on_farm') addMessage(errors, 'animalId', 'Choose an animal your farm keeps');
    }
    if (input.litterId) {
      const litter = await Litter.findOne({ where: { id: input.litterId, farmId }, transaction: tx });
      if (!litter) addMessage(errors, 'litterId', 'Choose a litter of your farm');
      else if (input.placedOn < litter.kindledOn) addMessage(errors, 'placedOn', 'That is before the litter was born');
    }
    const previous = await HousingPlacement.findOne({
      where: { endedOn: { [Op.is]: null }, ...(input.animalId ? { animalId: input.animalId } : { litterId: input.litterId! }) },
      transaction: tx,
      lock: tx.LOCK.UPDATE,
    });
    if (previous?.unitId === unitId) addMessage(errors, input.animalId ? 'animalId' : 'litterId', `Already in ${unit.name}`);
    if (previous && input.placedOn < previous.placedOn) addMessage(errors, 'placedOn', `It moved into its current place on ${previous.placedOn}; a new move comes after that`);
    if (Object.keys(errors).length > 0) throw AppError.validation(errors);
    if (unit.capacity !== null) {
      const occupied = await HousingPlacement.count({ where: { unitId, endedOn: { [Op.is]: null } }, transaction: tx });
      if (occupied >= unit.capacity) throw new AppError(ErrorCode.conflict, 409, `${unit.name} is full (${unit.capacity} places)`);
    }
    if (previous) {
      previous.endedOn = input.placedOn;
      await previous.save({ transaction: tx });
    }
    await HousingPlacement.create(
      { coopId: actor.coopId, farmId, unitId, animalId: input.animalId ?? null, litterId: input.litterId ?? null, placedOn: input.placedOn, note: input.note, recordedBy: actor.id },
      { transaction: tx },
    );
    if (input.animalId) await setAnimalHutchIn(tx, input.animalId, unit.name);
    announceHousing(tx, farmId);
    return (await present(tx, actor.coopId, clock.today, [unit]))[0]!;
  });
}

/** Ends a placement (the animal left the hutch: sold, processed, or moved out of any unit). */
export async function endPlacement(actor: SessionUser, placementId: string, input: PlacementEndInput): Promise<HousingUnitDto> {
  const farmId = farmOf(actor);
  return withTenant(actor, async (tx) => {
    const placement = await HousingPlacement.findOne({ where: { id: placementId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!placement || placement.farmId !== farmId) throw AppError.notFound('That placement');
    ensureCan(actor, 'update', 'HousingUnit', { farmId }, 'That placement', 'Only members of the farm move animals between hutches');
    if (placement.endedOn) throw new AppError(ErrorCode.conflict, 409, 'That placement has ended already');
    const clock = await farmClockOf(tx, actor.coopId, farmId);
    if (input.endedOn > clock.today) throw AppError.validation({ endedOn: [`${input.endedOn} is in the future (today is ${clock.today})`] });
    if (input.endedOn < placement.placedOn) throw AppError.validation({ endedOn: [`It was placed there on ${placement.placedOn}`] });
    placement.endedOn = input.endedOn;
    await placement.save({ transaction: tx });
    if (placement.animalId) await setAnimalHutchIn(tx, placement.animalId, '');
    announceHousing(tx, farmId);
    const unit = await HousingUnit.findByPk(placement.unitId, { transaction: tx });
    return (await present(tx, actor.coopId, clock.today, [unit!]))[0]!;
  });
}

/** Where a litter is housed now (for its page). */
export async function currentHousingOfLitter(tx: Transaction, litterId: string): Promise<{ unitId: string; unitName: string; placedOn: string } | null> {
  const placement = await HousingPlacement.findOne({ where: { litterId, endedOn: { [Op.is]: null } }, transaction: tx });
  if (!placement) return null;
  const unit = await HousingUnit.findByPk(placement.unitId, { transaction: tx });
  return { unitId: placement.unitId, unitName: unit?.name ?? '', placedOn: placement.placedOn };
}

/**
 * The hutch typed on an animal's record, as a placement (the herd's port): found by name on the farm
 * (without case) or made, the animal moved into it from `on` (its previous placement ends then); an empty
 * name ends its placement. Answers the hutch's own spelling, or '' when the animal lives in none.
 */
export async function moveAnimalIntoHutchIn(
  tx: Transaction, move: { coopId: string; farmId: string; animalId: string; hutch: string; on: string; actorId: string },
): Promise<string> {
  const name = move.hutch.trim().slice(0, 40);
  const previous = await HousingPlacement.findOne({ where: { animalId: move.animalId, endedOn: { [Op.is]: null } }, transaction: tx, lock: tx.LOCK.UPDATE });
  const endPrevious = async () => {
    if (!previous) return;
    previous.endedOn = previous.placedOn > move.on ? previous.placedOn : move.on;
    await previous.save({ transaction: tx });
  };
  if (name === '') {
    await endPrevious();
    announceHousing(tx, move.farmId);
    return '';
  }
  let unit = await HousingUnit.findOne({ where: { farmId: move.farmId, [Op.and]: [where(fn('lower', col('name')), name.toLowerCase())] }, transaction: tx });
  unit ??= await HousingUnit.create({ coopId: move.coopId, farmId: move.farmId, name, kind: 'hutch', capacity: null, notes: '' }, { transaction: tx });
  if (previous?.unitId === unit.id) return unit.name;
  await endPrevious();
  await HousingPlacement.create(
    { coopId: move.coopId, farmId: move.farmId, unitId: unit.id, animalId: move.animalId, litterId: null, placedOn: move.on, note: '', recordedBy: move.actorId },
    { transaction: tx },
  );
  announceHousing(tx, move.farmId);
  return unit.name;
}

/**
 * Animals loaded with a written hutch (a spreadsheet import) are placed the same way in one pass: a hutch
 * per new name of each farm, and a placement from the farm's today for each animal not placed yet.
 */
export async function placeByWrittenHutchIn(tx: Transaction, coopId: string, animalIds: string[]): Promise<void> {
  if (animalIds.length === 0) return;
  const run = (sql: string) => HousingUnit.sequelize!.query(sql, { bind: [coopId, animalIds], transaction: tx });
  const sameName = `u.farm_id = a.keeping_farm_id AND lower(u.name) = lower(left(btrim(a.hutch), 40)) AND u.deleted_at IS NULL`;
  // One hutch a name whatever its case, spelled as the first animal loaded wrote it.
  await run(`INSERT INTO housing_units (coop_id, farm_id, name, kind, notes)
    SELECT DISTINCT ON (a.keeping_farm_id, lower(left(btrim(a.hutch), 40))) a.coop_id, a.keeping_farm_id, left(btrim(a.hutch), 40), 'hutch', ''
    FROM unnest($2::uuid[]) WITH ORDINALITY AS loaded (id, n) JOIN animals a ON a.id = loaded.id
    WHERE a.coop_id = $1 AND btrim(a.hutch) <> '' AND a.keeping_farm_id IS NOT NULL AND a.disposition = 'on_farm'
      AND NOT EXISTS (SELECT 1 FROM housing_units u WHERE ${sameName})
    ORDER BY a.keeping_farm_id, lower(left(btrim(a.hutch), 40)), loaded.n`);
  // A hutch written over another (an import's update) moves the animal: its placement elsewhere ends today.
  await run(`UPDATE housing_placements p SET ended_on = GREATEST(p.placed_on, (now() AT TIME ZONE f.time_zone)::date)
    FROM animals a JOIN farms f ON f.id = a.keeping_farm_id, housing_units u
    WHERE a.coop_id = $1 AND a.id = ANY($2::uuid[]) AND btrim(a.hutch) <> '' AND p.animal_id = a.id AND p.ended_on IS NULL
      AND u.id = p.unit_id AND lower(u.name) <> lower(left(btrim(a.hutch), 40))`);
  await run(`INSERT INTO housing_placements (coop_id, farm_id, unit_id, animal_id, placed_on, note)
    SELECT a.coop_id, a.keeping_farm_id, u.id, a.id, (now() AT TIME ZONE f.time_zone)::date, ''
    FROM animals a JOIN farms f ON f.id = a.keeping_farm_id JOIN housing_units u ON ${sameName}
    WHERE a.coop_id = $1 AND a.id = ANY($2::uuid[]) AND btrim(a.hutch) <> '' AND a.disposition = 'on_farm'
      AND NOT EXISTS (SELECT 1 FROM housing_placements p WHERE p.animal_id = a.id AND p.ended_on IS NULL)`);
  await run(`UPDATE animals a SET hutch = u.name FROM housing_placements p JOIN housing_units u ON u.id = p.unit_id
    WHERE a.coop_id = $1 AND a.id = ANY($2::uuid[]) AND p.animal_id = a.id AND p.ended_on IS NULL AND a.hutch IS DISTINCT FROM u.name`);
}
