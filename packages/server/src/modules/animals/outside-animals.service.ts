import { ForbiddenError } from '@casl/ability';
import { Op, type Transaction } from 'sequelize';
import {
  defineAbilityFor, findPedigreeCycle, subjectOf, type OutsideAnimalInput, type OutsideAnimalResultDto, type PedigreeCardDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordAudit, recordChanges } from '../audit/audit.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { Animal } from './animal.model';
import { query, selectAnimalById, selectAnimals, type AnimalRow } from './animal-queries';
import { checkPedigree } from './animal-validation';
import type { FieldMessages } from '../farms/farm-access';
import { labelOf, presentCard, type PresentContext } from './animals.presenter';
import { loadPedigreeRows, lockCoopPedigree, recomputePedigreeFigures } from './pedigree-figures';

/**
 * Finds the registry's record for an ancestor known from papers, or creates it. The same ancestor
 * entered by two farms is one animal: a registration number matches any animal of the co-op with
 * that number; otherwise tattoo and name together match an outside animal. A match fills in what
 * its record lacked (breed, birth date, colour, registration) and never overwrites what it has.
 * Call with the pedigree lock held; figures are recomputed by the caller.
 */
export async function findOrCreateOutside(
  tx: Transaction,
  actor: SessionUser,
  input: OutsideAnimalInput,
  ctx: PresentContext,
  field: string,
): Promise<{ animalId: string | null; matched: boolean; errors: FieldMessages }> {
  const errors: FieldMessages = {};
  let match: AnimalRow | undefined;
  if (input.registrationNumber) {
    [match] = await selectAnimals(tx, actor.coopId, 'lower(a.registration_number) = lower($2)', [input.registrationNumber], { limit: 1 });
  }
  if (!match && input.tattoo) {
    [match] = await selectAnimals(
      tx,
      actor.coopId,
      `a.is_outside AND lower(a.tattoo) = lower($2) AND lower(a.name) = lower($3)
       AND ($4::text IS NULL OR a.registration_number IS NULL OR lower(a.registration_number) = lower($4))`,
      [input.tattoo, input.name, input.registrationNumber],
      { limit: 1 },
    );
  }

  if (match) {
    if (match.sex !== input.sex) {
      errors[field] = [`The co-op already knows ${labelOf(match)} (${input.registrationNumber ?? input.tattoo}) as a ${match.sex}`];
      return { animalId: null, matched: true, errors };
    }
    if (match.is_outside) await fillBlanks(tx, actor, match, input);
    return { animalId: match.id, matched: true, errors };
  }

  const { errors: pedigreeErrors } = await checkPedigree(
    tx,
    actor.coopId,
    { id: null, sex: input.sex, birthDate: input.birthDate, breedId: input.breedId, sireId: input.sireId, damId: input.damId },
    { ctx, today: ctx.today },
  );
  for (const [key, messages] of Object.entries(pedigreeErrors)) errors[field === '' ? key : `${field}.${key}`] = messages;
  if (Object.keys(errors).length > 0) return { animalId: null, matched: false, errors };

  const created = await Animal.create(
    {
      coopId: actor.coopId,
      isOutside: true,
      breedingFarmId: null,
      breederName: input.breederName,
      owningFarmId: null,
      keepingFarmId: null,
      tattoo: input.tattoo,
      name: input.name,
      sex: input.sex,
      breedId: input.breedId,
      colour: input.colour,
      birthDate: input.birthDate,
      sireId: input.sireId,
      damId: input.damId,
      registrationNumber: input.registrationNumber,
      createdBy: actor.id,
    },
    { transaction: tx },
  );
  await recordChanges(
    { coopId: actor.coopId, tableName: 'animals', recordId: created.id, actorUserId: actor.id, changes: { created: [null, 'outside animal from papers'] } },
    tx,
  );
  return { animalId: created.id, matched: false, errors };
}

async function fillBlanks(tx: Transaction, actor: SessionUser, match: AnimalRow, input: OutsideAnimalInput) {
  const blanks: Partial<Record<'breedId' | 'birthDate' | 'colour' | 'registrationNumber' | 'breederName', string>> = {};
  if (!match.breed_id && input.breedId) blanks.breedId = input.breedId;
  if (!match.birth_date && input.birthDate) blanks.birthDate = input.birthDate;
  if (!match.colour && input.colour) blanks.colour = input.colour;
  if (!match.registration_number && input.registrationNumber) blanks.registrationNumber = input.registrationNumber;
  if (!match.breeder_name && input.breederName) blanks.breederName = input.breederName;
  if (Object.keys(blanks).length === 0) return;
  const animal = await Animal.findByPk(match.id, { transaction: tx, lock: tx.LOCK.UPDATE });
  if (!animal) return;
  const changes: Record<string, [unknown, unknown]> = {};
  for (const [key, value] of Object.entries(blanks)) changes[key] = [animal.get(key as keyof Animal), value];
  animal.set(blanks);
  await animal.save({ transaction: tx });
  await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
}

/** The co-op's registry of outside animals, searchable by name, tattoo or registration number. */
export async function listOutsideAnimals(actor: SessionUser, search: string | undefined): Promise<PedigreeCardDto[]> {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('read', subjectOf('OutsideAnimal', { coopId: actor.coopId }));
  return withTenant(actor, async (tx) => {
    const ctx = await presentContextFor(actor, tx);
    const pattern = search ? `%${search.replace(/[\\%_]/g, '\\$&')}%` : null;
    const rows = await selectAnimals(
      tx,
      actor.coopId,
      `a.is_outside AND ($2::text IS NULL OR a.name ILIKE $2 OR a.tattoo ILIKE $2 OR a.registration_number ILIKE $2)`,
      [pattern],
      { orderBy: 'a.name, a.tattoo', limit: 200 },
    );
    return rows.map((row) => presentCard(row, ctx));
  });
}

/** A member enters an ancestor from papers; the registry answers with the existing record when it matches. */
export async function registerOutsideAnimal(actor: SessionUser, input: OutsideAnimalInput): Promise<OutsideAnimalResultDto> {
  ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('create', subjectOf('OutsideAnimal', { coopId: actor.coopId }));
  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const ctx = await presentContextFor(actor, tx);
    const result = await findOrCreateOutside(tx, actor, input, ctx, '');
    if (Object.keys(result.errors).length > 0 || !result.animalId) throw AppError.validation(result.errors);
    const changed = await recomputePedigreeFigures(actor.coopId, tx, [result.animalId]);
    announceAfterCommit(tx, actor.coopId, { farmIds: [], animalId: result.animalId, figuresChanged: changed });
    const row = await selectAnimalById(tx, actor.coopId, result.animalId);
    return { animal: presentCard(row!, ctx), matched: result.matched };
  });
}

/**
 * The admin merges a duplicate outside record into the one that stands: every reference to the
 * duplicate moves to it, blanks are filled from the duplicate, the duplicate is soft-deleted with a
 * pointer to the survivor, and pedigree figures are recomputed.
 */
export async function mergeOutsideAnimal(actor: SessionUser, duplicateId: string, intoId: string): Promise<PedigreeCardDto> {
  return withTenant(actor, async (tx) => {
    await lockCoopPedigree(actor.coopId, tx);
    const duplicate = await Animal.findOne({ where: { id: duplicateId, coopId: actor.coopId, isOutside: true }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!duplicate) throw AppError.notFound('That outside animal');
    ForbiddenError.from(defineAbilityFor(actor)).throwUnlessCan('merge', subjectOf('OutsideAnimal', { coopId: duplicate.coopId }));
    const into = intoId === duplicateId ? null : await Animal.findOne({ where: { id: intoId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!into) throw AppError.validation({ intoId: [intoId === duplicateId ? 'Choose a different record to keep' : "That record is not in the co-op's records: choose one from the list"] });
    if (into.sex !== duplicate.sex) throw AppError.validation({ intoId: [`One is a ${duplicate.sex}, the other a ${into.sex}: not the same animal`] });

    const pedigree = await loadPedigreeRows(actor.coopId, tx);
    const swap = (id: string | null) => (id === duplicate.id ? into.id : id);
    const proposed = pedigree
      .filter((row) => row.id !== duplicate.id)
      .map((row) =>
        row.id === into.id
          ? { ...row, sireId: swap(row.sireId ?? duplicate.sireId), damId: swap(row.damId ?? duplicate.damId) }
          : { ...row, sireId: swap(row.sireId), damId: swap(row.damId) },
      );
    if (findPedigreeCycle(proposed)) {
      throw AppError.validation({ intoId: ['Merging these would make an animal its own ancestor; they cannot be the same animal'] });
    }

    const children = await Animal.findAll({
      where: { coopId: actor.coopId, [Op.or]: [{ sireId: duplicate.id }, { damId: duplicate.id }] },
      transaction: tx,
      lock: tx.LOCK.UPDATE,
    });
    for (const child of children) {
      const changes: Record<string, [unknown, unknown]> = {};
      if (child.sireId === duplicate.id) changes.sireId = [duplicate.id, into.id];
      if (child.damId === duplicate.id) changes.damId = [duplicate.id, into.id];
      child.set({ sireId: swap(child.sireId), damId: swap(child.damId) });
      await child.save({ transaction: tx });
      await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: child.id, actorUserId: actor.id, changes }, tx);
    }

    const filled: Record<string, [unknown, unknown]> = {};
    const fields = ['registrationNumber', 'birthDate', 'breedId', 'colour', 'breederName', 'sireId', 'damId'] as const;
    const carried = Object.fromEntries(fields.map((f) => [f, duplicate.get(f)]));
    duplicate.set({ mergedIntoId: into.id });
    await duplicate.save({ transaction: tx });
    await duplicate.destroy({ transaction: tx });
    for (const field of fields) {
      const value = carried[field];
      if (value && !into.get(field)) {
        filled[field] = [into.get(field), value];
        into.set(field, value as never);
      }
    }
    if (Object.keys(filled).length > 0) {
      await into.save({ transaction: tx });
      await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: into.id, actorUserId: actor.id, changes: filled }, tx);
    }
    await recordChanges(
      { coopId: actor.coopId, tableName: 'animals', recordId: duplicate.id, actorUserId: actor.id, changes: { mergedIntoId: [null, into.id] } },
      tx,
    );
    await recordAudit(
      { coopId: actor.coopId, actorUserId: actor.id, action: 'outside_animal.merged', subjectType: 'animal', subjectId: into.id, details: { duplicateId, children: children.length } },
      tx,
    );
    const changed = await recomputePedigreeFigures(actor.coopId, tx);
    const farmIds = (await query<{ owning_farm_id: string | null; keeping_farm_id: string | null }>(
      tx,
      'SELECT owning_farm_id, keeping_farm_id FROM animals WHERE id = ANY($1::uuid[])',
      [children.map((c) => c.id)],
    )).flatMap((r) => [r.owning_farm_id, r.keeping_farm_id]);
    announceAfterCommit(tx, actor.coopId, { farmIds, animalId: into.id, figuresChanged: changed });
    const ctx = await presentContextFor(actor, tx);
    return presentCard((await selectAnimalById(tx, actor.coopId, into.id))!, ctx);
  });
}
