import type { Transaction } from 'sequelize';
import { type Action, type AnimalDetailDto, type CustodyMoveInput } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { AnimalStatusEvent } from './animal-status-event.model';
import { Animal } from './animal.model';
import { query } from './animal-queries';
import { tattooClash, tattooClashMessage } from './animal-validation';
import { animalForChange } from './animal-access';
import { detailOf } from './animal-detail';
import { hasMessages, type FieldMessages } from '../farms/farm-access';
import { type PresentContext } from './animals.presenter';
import { CustodyEvent } from './custody-event.model';

import { port } from '../../lib/port';

/*
 * Custody: which farm owns and which keeps an animal, and its moves between farms (transfer, loan, return).
 * Loans and trades build on applyCustodyMove; every arrival goes through the onArrival port.
 */

/** An animal arriving at a farm (bought, traded, lent to it, or back home from a loan). */
export interface Arrival {
  coopId: string;
  farmId: string;
  animalId: string;
  arrivedOn: string;
}

/**
 * What else happens in the transaction that records an arrival (the Almanac plans its quarantine). The
 * Almanac reads the herd, so the herd cannot import it; the composition root plugs it in.
 */
export const onArrival = port<(tx: Transaction, arrival: Arrival) => Promise<void>>('animal arrival');

/** An animal no longer belonging to a farm (transferred to another, sold, died, culled). */
export interface OwnershipEnd {
  coopId: string;
  animalId: string;
  formerFarmId: string;
}

/**
 * What else happens when a farm's ownership of an animal ends (the Swap Board closes its listings). The
 * Swap Board builds on the herd, so the herd cannot import it; the composition root plugs it in.
 */
export const onOwnershipEnded = port<(tx: Transaction, end: OwnershipEnd) => Promise<void>>('animal ownership ended', async () => {});

/** How a move made by another module's workflow differs from a plain one. */
export interface MoveOptions {
  /** The former owner's private notes stay with it (a sale through the Swap Board). */
  notesStay?: boolean;
}

/**
 * Moves an animal between farms of the co-op and keeps the move in its custody history: a transfer
 * of ownership, a loan out, or its return home. An arrival whose tattoo clashes with one the
 * destination already keeps is refused with a prompt to re-tattoo or add a farm suffix
 * (`newTattoo`). Later issues (loans, trades) build on `applyCustodyMove`.
 */
export async function moveAnimal(actor: SessionUser, animalId: string, input: CustodyMoveInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const action: Action = input.kind === 'transferred' ? 'trade' : input.kind === 'lent' ? 'lend' : 'update';
    const animal = await animalForChange(actor, animalId, action, tx);
    const ctx = await presentContextFor(actor, tx);
    await applyCustodyMove(tx, actor, animal, input, ctx);
    return detailOf(tx, actor, ctx, animalId);
  });
}

/**
 * A move made inside another module's workflow (a Stud Share hand-over or return), whose service has
 * already checked that the actor's farm is party to it. The same rules and history as `moveAnimal`.
 */
export async function moveAnimalInTransaction(tx: Transaction, actor: SessionUser, animalId: string, input: CustodyMoveInput, options: MoveOptions = {}): Promise<void> {
  const animal = await Animal.findOne({ where: { id: animalId, coopId: actor.coopId }, transaction: tx, lock: tx.LOCK.UPDATE });
  if (!animal) throw AppError.notFound('That animal');
  await applyCustodyMove(tx, actor, animal, input, await presentContextFor(actor, tx), options);
}

export async function applyCustodyMove(
  tx: Transaction, actor: SessionUser, animal: Animal, input: CustodyMoveInput, ctx: PresentContext, options: MoveOptions = {},
): Promise<void> {
  const errors: FieldMessages = {};
  const from = animal.keepingFarmId!;
  const to = input.kind === 'returned' ? animal.owningFarmId! : input.toFarmId!;
  if (animal.disposition !== 'on_farm') errors.kind = ['It is no longer on a farm'];
  if (input.kind !== 'returned' && !ctx.farms.has(to)) errors.toFarmId = ['That farm is not in your co-op: choose one from the list'];
  if (input.kind !== 'returned' && to === animal.owningFarmId) errors.toFarmId = ['It already belongs to that farm'];
  if (input.kind !== 'returned' && animal.keepingFarmId !== animal.owningFarmId) errors.kind = ['It is on loan elsewhere; record its return first'];
  if (input.kind === 'returned' && animal.keepingFarmId === animal.owningFarmId) errors.kind = ['It is already at home'];
  if (input.movedOn > ctx.today) errors.movedOn = ['A move cannot be dated in the future'];
  const [last] = await query<{ moved_on: string }>(tx, 'SELECT max(moved_on)::text AS moved_on FROM animal_custody_events WHERE animal_id = $1', [animal.id]);
  if (last?.moved_on && input.movedOn < last.moved_on) errors.movedOn = [`Its last move was on ${last.moved_on}; a new one cannot be earlier`];

  const tattoo = input.newTattoo ?? animal.tattoo!;
  if (!errors.toFarmId && ctx.farms.has(to)) {
    const clash = await tattooClash(tx, actor.coopId, to, tattoo, animal.id);
    if (clash) {
      const destination = ctx.farms.get(to)!.name;
      const message = tattooClashMessage(tattoo, clash, `at ${destination}`, ctx.farms.get(from)?.name ?? 'Farm');
      (errors[input.newTattoo ? 'newTattoo' : 'tattoo'] ??= []).push(input.newTattoo ? message : `${message} Give the new tattoo as newTattoo.`);
    }
  }
  if (hasMessages(errors)) throw AppError.validation(errors);

  const before = { owningFarmId: animal.owningFarmId, keepingFarmId: animal.keepingFarmId, tattoo: animal.tattoo, hutch: animal.hutch };
  // A hutch number means something only on the farm that assigned it.
  // The owner-only notes of a sale whose notes stay are not the buyer's to read.
  if (input.kind === 'transferred') animal.set({ owningFarmId: to, keepingFarmId: to, hutch: '', ...(options.notesStay ? { notes: '' } : {}) });
  else animal.set({ keepingFarmId: to, hutch: input.kind === 'lent' ? '' : animal.hutch });
  animal.tattoo = tattoo;
  await animal.save({ transaction: tx });

  await CustodyEvent.create(
    {
      coopId: actor.coopId,
      animalId: animal.id,
      kind: input.kind,
      fromFarmId: from,
      toFarmId: to,
      owningFarmId: animal.owningFarmId,
      keepingFarmId: animal.keepingFarmId,
      movedOn: input.movedOn,
      tattooBefore: tattoo !== before.tattoo ? before.tattoo : null,
      tattooAfter: tattoo !== before.tattoo ? tattoo : null,
      note: input.note,
      notesTravel: !options.notesStay,
      recordedBy: actor.id,
    },
    { transaction: tx },
  );
  // Arriving at a farm (traded, lent to it, back home from a loan): the Almanac plans its quarantine there.
  await onArrival(tx, { coopId: actor.coopId, farmId: to, animalId: animal.id, arrivedOn: input.movedOn });
  if (input.kind === 'transferred' && before.owningFarmId) await onOwnershipEnded(tx, { coopId: actor.coopId, animalId: animal.id, formerFarmId: before.owningFarmId });
  if (input.kind === 'transferred') {
    await AnimalStatusEvent.bulkCreate(
      [
        { coopId: actor.coopId, animalId: animal.id, farmId: from, kind: 'disposition', value: 'transferred', cause: `To ${ctx.farms.get(to)?.name}`, effectiveOn: input.movedOn, recordedBy: actor.id },
        { coopId: actor.coopId, animalId: animal.id, farmId: to, kind: 'disposition', value: 'on_farm', cause: null, effectiveOn: input.movedOn, recordedBy: actor.id },
      ],
      { transaction: tx },
    );
  }
  const changes: Record<string, [unknown, unknown]> = {};
  for (const key of ['owningFarmId', 'keepingFarmId', 'tattoo', 'hutch'] as const) {
    if (before[key] !== animal.get(key)) changes[key] = [before[key], animal.get(key)];
  }
  await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
  announceAfterCommit(tx, actor.coopId, { farmIds: [from, to, before.owningFarmId], animalId: animal.id, figuresChanged: 1 });
}

