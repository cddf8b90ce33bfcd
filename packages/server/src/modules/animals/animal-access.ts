import type { Transaction } from 'sequelize';
import { subjectOf, type Action } from '@burrowline/shared';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { Animal } from './animal.model';
import { type AnimalRow } from './animal-queries';
import { authorize, type FarmRecord } from '../farms/farm-access';


/** The subject CASL checks for an animal: the owning farm has rights on it, the keeping farm reads it. */
export function animalSubject(row: { coopId: string; owningFarmId: string | null; keepingFarmId: string | null }) {
  return subjectOf('Animal', { coopId: row.coopId, owningFarmId: row.owningFarmId, keepingFarmId: row.keepingFarmId });
}

export function subjectOfRow(row: Pick<AnimalRow, 'coop_id' | 'owning_farm_id' | 'keeping_farm_id'>) {
  return animalSubject({ coopId: row.coop_id, owningFarmId: row.owning_farm_id, keepingFarmId: row.keeping_farm_id });
}

/** Loads an animal for a change; another co-op's (or a missing) animal is 404, someone else's farm 403. */
export async function animalForChange(actor: SessionUser, animalId: string, action: Action, tx: Transaction): Promise<Animal> {
  const animal = await Animal.findOne({ where: { id: animalId, coopId: actor.coopId, isOutside: false }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!animal) throw AppError.notFound('That animal');
  authorize(actor, action, animalRecord(animal), 'You may not do that');
  return animal;
}


/**
 * An animal as the farm access check sees it: it belongs to its owning and keeping farm (a lent buck to
 * both), and the whole co-op knows it through its pedigree card, so a refusal on it is a 403.
 */
export function animalRecord(animal: { owningFarmId: string | null; keepingFarmId: string | null }): FarmRecord {
  return {
    subject: 'Animal',
    fields: { owningFarmId: animal.owningFarmId, keepingFarmId: animal.keepingFarmId },
    farmIds: [animal.owningFarmId, animal.keepingFarmId],
    what: 'That animal',
    knownToCoop: true,
  };
}
