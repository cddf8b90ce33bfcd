import { defineAbilityFor, ErrorCode, subjectOf, type Action, type SubjectName } from '@burrowline/shared';
import type { SessionUser } from '../../http/passport';
import { AppError } from '../../lib/app-error';

/** The farm whose Almanac the actor works in (an apprentice: the mentor's); someone of no farm has none. */
export function farmOf(actor: SessionUser): string {
  if (!actor.farmId) throw new AppError(ErrorCode.forbidden, 403, 'Only a member of a farm has an Almanac');
  return actor.farmId;
}

/**
 * Checks a farm-private Almanac or litter record. Another farm's (or co-op's) record does not exist for
 * the actor: 404, so its existence never leaks. On the actor's own farm a refused action is 403 (an
 * apprentice planning, or asking for the calendar feed), with the reason.
 */
export function ensureCan(
  actor: SessionUser,
  action: Action,
  subjectName: SubjectName,
  fields: Record<string, unknown>,
  what: string,
  refusal = 'You may not do that here',
): void {
  const ability = defineAbilityFor(actor);
  const subject = subjectOf(subjectName, { coopId: actor.coopId, ...fields });
  if (ability.can(action, subject)) return;
  if (fields.farmId !== actor.farmId) throw AppError.notFound(what);
  throw new AppError(ErrorCode.forbidden, 403, refusal);
}

export type FieldMessages = Record<string, string[]>;

export function addMessage(messages: FieldMessages, field: string, message: string): void {
  (messages[field] ??= []).push(message);
}

/** Errors refuse the whole write (400, nothing saved); warnings ask for `confirm: true` (422). */
export function refuseOrConfirm(errors: FieldMessages, warnings: FieldMessages, confirmed: boolean | undefined): void {
  if (Object.keys(errors).length > 0) throw AppError.validation(errors);
  if (Object.keys(warnings).length > 0 && !confirmed) {
    throw new AppError(ErrorCode.confirmationRequired, 422, 'Please check the warnings; save again with confirmation if they are right', warnings);
  }
}
