import {
  defineAbilityFor, ErrorCode, subjectOf, type Action, type AppAbility, type SubjectName,
} from '@burrowline/shared';
import { AppError } from '../../lib/app-error';
import type { SessionUser } from '../../lib/session-user';

/** The farm the actor works on (an apprentice: the mentor's); someone of no farm is refused. */
export function farmOf(actor: SessionUser, refusal = 'Only a member of a farm may do that'): string {
  if (!actor.farmId) throw new AppError(ErrorCode.forbidden, 403, refusal);
  return actor.farmId;
}

/** A farm-private record as the access check sees it. */
export interface FarmRecord {
  subject: SubjectName;
  /** The fields the CASL rules match (e.g. `{ farmId }`, `{ owningFarmId, keepingFarmId }`); the co-op is added. */
  fields: Record<string, unknown>;
  /** Every farm the record belongs to: owning, keeping, host, counterparty. Each of them knows it exists. */
  farmIds: readonly (string | null | undefined)[];
  /** The record's co-op when the caller has it; another co-op's record never exists for the actor. */
  coopId?: string;
  /** How a refusal names it: "That group". */
  what: string;
  /** Records the whole co-op knows of (an animal's pedigree card): a refusal is always 403. */
  knownToCoop?: boolean;
}

function isVisible(actor: SessionUser, ability: AppAbility, subject: Record<string, unknown>, record: FarmRecord): boolean {
  if (record.knownToCoop) return true;
  if (actor.farmId && record.farmIds.includes(actor.farmId)) return true;
  return ability.can('read', subject);
}

/**
 * The one access check for farm-private records. A record the actor may not know exists (another
 * co-op's, or of farms the actor neither belongs to nor may read) is a 404, so its existence never
 * leaks; a visible record the actor may not act on is a 403 with the reason.
 */
export function authorize(actor: SessionUser, action: Action, record: FarmRecord, refusal = 'You may not do that here'): void {
  if (record.coopId && record.coopId !== actor.coopId) throw AppError.notFound(record.what);
  const ability = defineAbilityFor(actor);
  const subject = subjectOf(record.subject, { coopId: actor.coopId, ...record.fields });
  if (ability.can(action, subject)) return;
  if (!isVisible(actor, ability, subject, record)) throw AppError.notFound(record.what);
  throw new AppError(ErrorCode.forbidden, 403, refusal);
}

/** `authorize` for the common record of one farm, whose subject carries `{ farmId }`. */
export function ensureCan(
  actor: SessionUser,
  action: Action,
  subjectName: SubjectName,
  fields: Record<string, unknown>,
  what: string,
  refusal = 'You may not do that here',
): void {
  authorize(actor, action, { subject: subjectName, fields, farmIds: [fields.farmId as string | undefined], what }, refusal);
}

/** Whether the actor sees prices and costs of the farm's records. */
export function canSeeMoney(actor: SessionUser, farmId: string): boolean {
  return defineAbilityFor(actor).can('read', subjectOf('Money', { coopId: actor.coopId, farmId }));
}

export type FieldMessages = Record<string, string[]>;

export function addMessage(messages: FieldMessages, field: string, message: string): void {
  (messages[field] ??= []).push(message);
}

export function hasMessages(messages: FieldMessages): boolean {
  return Object.keys(messages).length > 0;
}

export function mergeMessages(into: FieldMessages, from: FieldMessages): void {
  for (const [field, list] of Object.entries(from)) (into[field] ??= []).push(...list);
}

/** Errors refuse the whole write (400, nothing saved); warnings ask for `confirm: true` (422). */
export function refuseOrConfirm(errors: FieldMessages, warnings: FieldMessages, confirmed: boolean | undefined): void {
  if (hasMessages(errors)) throw AppError.validation(errors);
  if (hasMessages(warnings) && !confirmed) {
    throw new AppError(ErrorCode.confirmationRequired, 422, 'Please check the warnings; save again with confirmation if they are right', warnings);
  }
}
