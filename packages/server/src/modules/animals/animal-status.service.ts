import type { Transaction } from 'sequelize';
import { type AnimalDetailDto, type Disposition, type Lifecycle, type StatusEventInput } from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { announceAfterCommit, presentContextFor } from './animal-context';
import { AnimalStatusEvent } from './animal-status-event.model';
import { tattooClash, tattooClashMessage } from './animal-validation';
import { animalForChange } from './animal-access';
import { detailOf } from './animal-detail';
import { hasMessages, type FieldMessages } from '../farms/farm-access';
import { CustodyEvent } from './custody-event.model';
import { onOwnershipEnded } from './custody-moves.service';

/* Dated lifecycle and disposition changes; processing calls applyStatusEvent inside its transaction. */

/** Records a dated lifecycle or disposition change (with a cause for a cull) on the owning farm. */
export async function recordStatus(actor: SessionUser, animalId: string, input: StatusEventInput): Promise<AnimalDetailDto> {
  return withTenant(actor, async (tx) => {
    const ctx = await applyStatusEvent(tx, actor, animalId, input);
    return detailOf(tx, actor, ctx, animalId);
  });
}

/**
 * A lifecycle or disposition change inside the caller's transaction (a processing record sets
 * 'processed'): the same checks and history as recordStatus; throws AppError when refused.
 */
export async function applyStatusEvent(tx: Transaction, actor: SessionUser, animalId: string, input: StatusEventInput) {
  {
    const animal = await animalForChange(actor, animalId, 'update', tx);
    const ctx = await presentContextFor(actor, tx);
    const errors: FieldMessages = {};
    if (input.effectiveOn > ctx.today) errors.effectiveOn = ['A status change cannot be dated in the future'];
    if (animal.birthDate && input.effectiveOn < animal.birthDate) errors.effectiveOn = ['That is before the animal was born'];
    const current = input.kind === 'lifecycle' ? animal.lifecycle : animal.disposition;
    if (current === input.value) (errors.value ??= []).push('That is already its status');
    if (input.kind === 'lifecycle' && animal.disposition !== 'on_farm') (errors.value ??= []).push('It is no longer on a farm');
    if (input.kind === 'disposition' && input.value === 'on_farm' && animal.keepingFarmId && animal.tattoo) {
      const clash = await tattooClash(tx, actor.coopId, animal.keepingFarmId, animal.tattoo, animal.id);
      if (clash) errors.value = [`${tattooClashMessage(animal.tattoo, clash, 'in your herd', null)} Change its tattoo first.`];
    }
    if (hasMessages(errors)) throw AppError.validation(errors);

    const changes: Record<string, [unknown, unknown]> = {};
    if (input.kind === 'lifecycle') {
      changes.lifecycle = [animal.lifecycle, input.value];
      animal.lifecycle = input.value as Lifecycle;
    } else {
      changes.disposition = [animal.disposition, input.value];
      changes.dispositionCause = [animal.dispositionCause, input.cause ?? null];
      animal.disposition = input.value as Disposition;
      animal.dispositionCause = input.value === 'on_farm' ? null : (input.cause ?? null);
    }
    await animal.save({ transaction: tx });
    await AnimalStatusEvent.create(
      {
        coopId: actor.coopId,
        animalId,
        farmId: animal.owningFarmId,
        kind: input.kind,
        value: input.value,
        cause: input.cause ?? null,
        effectiveOn: input.effectiveOn,
        recordedBy: actor.id,
      },
      { transaction: tx },
    );
    if (input.kind === 'disposition' && input.value === 'sold') {
      await CustodyEvent.create(
        {
          coopId: actor.coopId, animalId, kind: 'left', fromFarmId: animal.keepingFarmId, toFarmId: null,
          owningFarmId: animal.owningFarmId, keepingFarmId: animal.keepingFarmId, movedOn: input.effectiveOn,
          note: input.cause ?? 'Sold outside the co-op', recordedBy: actor.id,
        },
        { transaction: tx },
      );
    }
    if (input.kind === 'disposition' && input.value !== 'on_farm' && animal.owningFarmId) {
      await onOwnershipEnded(tx, { coopId: actor.coopId, animalId, formerFarmId: animal.owningFarmId });
    }
    await recordChanges({ coopId: actor.coopId, tableName: 'animals', recordId: animal.id, actorUserId: actor.id, changes }, tx);
    // Leaving or returning changes the card's "on farm" and current farm for everyone.
    announceAfterCommit(tx, actor.coopId, {
      farmIds: [animal.owningFarmId, animal.keepingFarmId],
      animalId,
      figuresChanged: input.kind === 'disposition' ? 1 : 0,
    });
    return ctx;
  }
}

