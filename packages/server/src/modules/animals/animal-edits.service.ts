import type { Transaction } from 'sequelize';
import {
  countOf,  daysBetween, ErrorCode, type AnimalCreateInput, type AnimalDetailDto, type AnimalUpdateInput, type Lifecycle, type Sex,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { AnimalStatusEvent } from './animal-status-event.model';
import { Animal } from './animal.model';
import { query } from './animal-queries';
import { checkPedigree, tattooClash, tattooClashMessage } from './animal-validation';
import { animalForChange, animalRecord } from './animal-access';
import { detailOf } from './animal-detail';
import { onArrival } from './custody-moves.service';
import { authorize, mergeMessages, refuseOrConfirm, type FieldMessages } from '../farms/farm-access';
import { type PresentContext } from './animals.presenter';
import { CustodyEvent } from './custody-event.model';
import { findOrCreateOutside } from './outside-animals.service';
import { loadPedigreeRows, lockCoopPedigree, recomputePedigreeFigures } from './pedigree-figures';
import { port } from '../../lib/port';

/**
 * Where an animal lives is its placement in one of the farm's hutches (litters' housing, plugged in by the
 * composition root): a hutch typed on the record is found by name or made, the animal moved into it from
 * `on`, and an empty one ends its placement. Answers the hutch's own spelling ('' when none).
 */
export const moveIntoHutch = port<(tx: Transaction, move: { coopId: string; farmId: string; animalId: string; hutch: string; on: string; actorId: string }) => Promise<string>>('herd hutch placement');

/** Animals loaded with a written hutch are placed in the farm's hutch of that name in one pass (litters' housing). */
export const placeByWrittenHutch = port<(tx: Transaction, coopId: string, animalIds: string[]) => Promise<void>>('herd import hutch placement');

/** The hutch field mirrors the current placement (written by housing when an animal moves on the Hutches screen). */
export async function setAnimalHutchIn(tx: Transaction, animalId: string, hutch: string): Promise<void> {
  await query(tx, 'UPDATE animals SET hutch = $2 WHERE id = $1 AND hutch IS DISTINCT FROM $2 RETURNING id', [animalId, hutch]);
}

/* Adding and editing animals; litters call createAnimal for a kit given its own record. */

function defaultLifecycle(sex: Sex, birthDate: string, today: string, firstBreeding: { doe: number; buck: number } | null): Lifecycle {
  const age = daysBetween(birthDate, today);
  // Kits stay with the doe to weaning, 4–8 weeks (Texas Extension; Rabbit Production).
  if (age < 56) return 'kit';
  const grown = firstBreeding ? (sex === 'doe' ? firstBreeding.doe : firstBreeding.buck) : sex === 'doe' ? 137 : 167;
  return age < grown ? 'junior' : 'breeding';
}

async function resolvePapersParent(
  tx: Transaction,
  actor: SessionUser,
  ctx: PresentContext,
  papers: AnimalCreateInput['sireFromPapers'],
  sex: Sex,
  field: string,
  errors: FieldMessages,
): Promise<string | null> {
  if (!papers) return null;
  const result = await findOrCreateOutside(tx, actor, { ...papers, sex, sireId: null, damId: null }, ctx, field);
  mergeMessages(errors, result.errors);
  return result.animalId;
}

/**
 * Adds an animal to the actor's farm, born here or arrived, with its parents (co-op animals,
 * outside animals, or new ones from papers). Refuses with field errors and writes nothing on bad
 * input; asks for confirmation when a parent was younger than its breed's first-breeding age.
 * Recomputes the co-op's pedigree figures in the same transaction.
 */
export async function createAnimal(actor: SessionUser, input: AnimalCreateInput): Promise<AnimalDetailDto> {
  const farmId = actor.farmId;
  if (!farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm can add animals');
  authorize(actor, 'create', animalRecord({ owningFarmId: farmId, keepingFarmId: farmId }), 'You may not do that');

  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const ctx = await presentContextFor(actor, tx);
    if (input.id) {
      const existing = await Animal.findOne({ where: { id: input.id }, paranoid: false, transaction: tx });
      if (existing && existing.owningFarmId === farmId && !existing.deletedAt) return detailOf(tx, actor, ctx, existing.id);
      if (existing) throw AppError.idTaken();
    }

    const errors: FieldMessages = {};
    const sireId = input.sireId ?? (await resolvePapersParent(tx, actor, ctx, input.sireFromPapers, 'buck', 'sireFromPapers', errors));
    const damId = input.damId ?? (await resolvePapersParent(tx, actor, ctx, input.damFromPapers, 'doe', 'damFromPapers', errors));

    const clash = await tattooClash(tx, actor.coopId, farmId, input.tattoo, null);
    if (clash) {
      const suffixFrom = input.origin === 'arrived' ? input.breederName || 'Arrival' : null;
      (errors.tattoo ??= []).push(tattooClashMessage(input.tattoo, clash, 'in your herd', suffixFrom));
    }
    if (input.arrivedOn && input.arrivedOn > ctx.today) (errors.arrivedOn ??= []).push('An arrival date cannot be in the future');

    const check = await checkPedigree(
      tx,
      actor.coopId,
      { id: null, sex: input.sex, birthDate: input.birthDate, breedId: input.breedId, sireId, damId },
      {
        ctx,
        today: ctx.today,
        fieldFor: { sire: input.sireFromPapers ? 'sireFromPapers' : 'sireId', dam: input.damFromPapers ? 'damFromPapers' : 'damId' },
        kitOfFarm: farmId,
      },
    );
    mergeMessages(errors, check.errors);
    refuseOrConfirm(errors, check.warnings, input.confirm);

    const breed = input.breedId ? ctx.breeds.get(input.breedId) : undefined;
    const firstBreeding = breed ? { doe: breed.firstBreedingDays.doe.min, buck: breed.firstBreedingDays.buck.min } : null;
    const lifecycle = input.lifecycle ?? defaultLifecycle(input.sex, input.birthDate, ctx.today, firstBreeding);
    const arrived = input.origin === 'arrived';
    const startsOn = arrived ? input.arrivedOn! : input.birthDate;
    // A kit is a kit from birth; an older animal entered now is recorded at its stage from today.
    const stageFrom = arrived ? startsOn : lifecycle === 'kit' ? input.birthDate : ctx.today;

    const animal = await Animal.create(
      {
        ...(input.id ? { id: input.id } : {}),
        coopId: actor.coopId,
        isOutside: false,
        breedingFarmId: arrived ? null : farmId,
        breederName: arrived ? input.breederName : '',
        owningFarmId: farmId,
        keepingFarmId: farmId,
        tattoo: input.tattoo,
        name: input.name,
        sex: input.sex,
        breedId: input.breedId,
        colour: input.colour,
        birthDate: input.birthDate,
        sireId,
        damId,
        registrationNumber: input.registrationNumber,
        notes: input.notes,
        hutch: input.hutch,
        lifecycle,
        disposition: 'on_farm',
        createdBy: actor.id,
      },
      { transaction: tx },
    );
    await AnimalStatusEvent.bulkCreate(
      [
        { coopId: actor.coopId, animalId: animal.id, farmId, kind: 'lifecycle', value: lifecycle, cause: null, effectiveOn: stageFrom, recordedBy: actor.id },
        { coopId: actor.coopId, animalId: animal.id, farmId, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: startsOn, recordedBy: actor.id },
      ],
      { transaction: tx },
    );
    await CustodyEvent.create(
      {
        coopId: actor.coopId,
        animalId: animal.id,
        kind: arrived ? 'arrived' : 'born',
        fromFarmId: null,
        toFarmId: farmId,
        owningFarmId: farmId,
        keepingFarmId: farmId,
        movedOn: startsOn,
        note: arrived && input.breederName ? `From ${input.breederName}` : '',
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    // An arrival is isolated under the co-op's quarantine rule: the Almanac plans its quarantine.
    if (arrived) await onArrival(tx, { coopId: actor.coopId, farmId, animalId: animal.id, arrivedOn: startsOn });
    if (input.hutch) {
      const hutch = await moveIntoHutch(tx, { coopId: actor.coopId, farmId, animalId: animal.id, hutch: input.hutch, on: ctx.today, actorId: actor.id });
      if (hutch !== animal.hutch) await setAnimalHutchIn(tx, animal.id, hutch);
    }
    await recordChanges(
      { coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes: { created: [null, arrived ? 'arrived' : 'born here'] } },
      tx,
    );
    // Parents entered from papers are new records too.
    const changed = await recomputePedigreeFigures(actor.coopId, tx, [animal.id, sireId, damId].filter((id): id is string => Boolean(id)));
    announceAfterCommit(tx, actor.coopId, { farmIds: [farmId], animalId: animal.id, figuresChanged: changed });
    return detailOf(tx, actor, ctx, animal.id);
  });
}

const editableFields = ['tattoo', 'name', 'sex', 'breedId', 'colour', 'birthDate', 'sireId', 'damId', 'registrationNumber', 'hutch', 'notes'] as const;
type EditableField = (typeof editableFields)[number];

/**
 * Edits an animal of the actor's farm from the version it was read at (else 409). A changed parent,
 * sex or birth date is checked against the whole pedigree (no cycle, no doe as sire, no parent born
 * after its offspring, no offspring born before its parent); a changed sire, dam or declared breed
 * recomputes the co-op's COI and breed make-up in the same transaction. Kept in the edit history.
 */
export async function updateAnimal(actor: SessionUser, animalId: string, input: AnimalUpdateInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const animal = await animalForChange(actor, animalId, 'update', tx);
    if (animal.version !== input.version) throw AppError.staleVersion();
    const ctx = await presentContextFor(actor, tx);
    const errors: FieldMessages = {};

    const proposed: Partial<Record<EditableField, unknown>> = {};
    for (const field of editableFields) if (input[field] !== undefined) proposed[field] = input[field];
    if (input.sireFromPapers) proposed.sireId = await resolvePapersParent(tx, actor, ctx, input.sireFromPapers, 'buck', 'sireFromPapers', errors);
    if (input.damFromPapers) proposed.damId = await resolvePapersParent(tx, actor, ctx, input.damFromPapers, 'doe', 'damFromPapers', errors);

    const changes: Record<string, [unknown, unknown]> = {};
    for (const [field, value] of Object.entries(proposed) as [EditableField, unknown][]) {
      const before = animal.get(field);
      if (before !== value) changes[field] = [before, value];
    }
    const next = <K extends EditableField>(field: K) => (field in changes ? changes[field]![1] : animal.get(field)) as Animal[K];

    if (changes.tattoo && animal.disposition === 'on_farm' && animal.keepingFarmId) {
      const clash = await tattooClash(tx, actor.coopId, animal.keepingFarmId, next('tattoo')!, animal.id);
      if (clash) (errors.tattoo ??= []).push(tattooClashMessage(next('tattoo')!, clash, 'in your herd', null));
    }
    if (changes.sex) {
      const role = animal.sex === 'buck' ? 'sire' : 'dam';
      const [{ count }] = (await query<{ count: string }>(tx, `SELECT count(*) FROM animals WHERE coop_id = $1 AND deleted_at IS NULL AND ${role}_id = $2`, [actor.coopId, animal.id])) as [{ count: string }];
      if (Number(count) > 0) (errors.sex ??= []).push(`This animal is recorded as the ${role} of ${countOf(Number(count), 'animal')}; its sex cannot change`);
    }
    if (changes.birthDate) {
      const [early] = await query<{ name: string; tattoo: string | null; birth_date: string }>(
        tx,
        `SELECT name, tattoo, birth_date::text AS birth_date FROM animals
         WHERE coop_id = $1 AND deleted_at IS NULL AND (sire_id = $2 OR dam_id = $2) AND birth_date <= $3::date
         ORDER BY birth_date LIMIT 1`,
        [actor.coopId, animal.id, next('birthDate')],
      );
      if (early) (errors.birthDate ??= []).push(`${early.name || early.tattoo} was born on ${early.birth_date}, before this date; a parent is born first`);
    }

    let warnings: FieldMessages = {};
    const pedigreeTouched = ['sireId', 'damId', 'breedId', 'birthDate', 'sex'].some((f) => f in changes);
    if (pedigreeTouched) {
      const check = await checkPedigree(
        tx,
        actor.coopId,
        { id: animal.id, sex: next('sex'), birthDate: next('birthDate'), breedId: next('breedId'), sireId: next('sireId'), damId: next('damId') },
        {
          ctx,
          today: ctx.today,
          pedigree: await loadPedigreeRows(actor.coopId, tx),
          fieldFor: { sire: input.sireFromPapers ? 'sireFromPapers' : 'sireId', dam: input.damFromPapers ? 'damFromPapers' : 'damId' },
          // An older record whose dam and date stay as they were is not refused for an unrelated edit.
          ...(('damId' in changes || 'birthDate' in changes) && animal.keepingFarmId ? { kitOfFarm: animal.keepingFarmId } : {}),
        },
      );
      // Only parents that changed (or whose relation to a changed date changed) are warned about again.
      mergeMessages(errors, check.errors);
      warnings = check.warnings;
      if (!('sireId' in changes) && !('birthDate' in changes)) delete warnings.sireId;
      if (!('damId' in changes) && !('birthDate' in changes)) delete warnings.damId;
    }
    refuseOrConfirm(errors, warnings, input.confirm);

    if (Object.keys(changes).length > 0) {
      animal.set(Object.fromEntries(Object.entries(changes).map(([k, [, v]]) => [k, v])));
      await animal.save({ transaction: tx });
      await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
    }
    if ('hutch' in changes && animal.keepingFarmId && animal.keepingFarmId === actor.farmId && animal.disposition === 'on_farm' && !animal.isOutside) {
      const hutch = await moveIntoHutch(tx, { coopId: actor.coopId, farmId: animal.keepingFarmId, animalId: animal.id, hutch: next('hutch'), on: ctx.today, actorId: actor.id });
      if (hutch !== next('hutch')) await setAnimalHutchIn(tx, animal.id, hutch);
    }
    const figuresChanged = ['sireId', 'damId', 'breedId'].some((f) => f in changes) ? await recomputePedigreeFigures(actor.coopId, tx, [animal.id, next('sireId'), next('damId')].filter((id): id is string => Boolean(id))) : 0;
    if (Object.keys(changes).length > 0) {
      announceAfterCommit(tx, actor.coopId, { farmIds: [animal.owningFarmId, animal.keepingFarmId], animalId: animal.id, figuresChanged });
    }
    return detailOf(tx, actor, ctx, animal.id);
  });
}

