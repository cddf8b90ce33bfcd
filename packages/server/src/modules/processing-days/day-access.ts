import { defineAbilityFor, ErrorCode, subjectOf } from '@burrowline/shared';
import { AppError } from '../../lib/app-error';
import { canSeeMoney } from '../farms/farm-access';
import type { SessionUser } from '../../lib/session-user';
import type { DayRow, SiteRow } from './processing-days-store';

/** Who may do what on processing days, from the one ability. */

export function isDayAdmin(actor: SessionUser): boolean {
  return defineAbilityFor(actor).can('manage', subjectOf('ProcessingDay', { coopId: actor.coopId }));
}

export function canHost(actor: SessionUser, day: Pick<DayRow, 'host_farm_id'>): boolean {
  return defineAbilityFor(actor).can('host', subjectOf('ProcessingDay', { coopId: actor.coopId, hostFarmId: day.host_farm_id }));
}

export function ensureHost(actor: SessionUser, day: Pick<DayRow, 'host_farm_id'>, refusal: string): void {
  if (!canHost(actor, day)) throw new AppError(ErrorCode.forbidden, 403, refusal);
}

export function canSchedule(actor: SessionUser, site: Pick<SiteRow, 'host_farm_id' | 'host_may_schedule'>, action: 'create' | 'update' = 'create'): boolean {
  return defineAbilityFor(actor).can(action, subjectOf('ProcessingDay', { coopId: actor.coopId, hostFarmId: site.host_farm_id, hostMaySchedule: site.host_may_schedule }));
}

export function ensureSchedule(actor: SessionUser, site: Pick<SiteRow, 'host_farm_id' | 'host_may_schedule'>, action: 'create' | 'update' = 'create'): void {
  if (!canSchedule(actor, site, action)) {
    throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin, or the site\'s host when the admin allows it, schedules processing days');
  }
}

export function ensureSiteAdmin(actor: SessionUser): void {
  if (!isDayAdmin(actor)) throw new AppError(ErrorCode.forbidden, 403, 'Only the co-op\'s admin keeps the processing sites');
}

/** Books, changes and cancels for one farm: its members (never apprentices) and the admin. */
export function canBookFor(actor: SessionUser, farmId: string): boolean {
  const ability = defineAbilityFor(actor);
  return ability.can('book', subjectOf('ProcessingDay', { coopId: actor.coopId })) && ability.can('manage', subjectOf('ProcessingBooking', { coopId: actor.coopId, farmId }));
}

export function ensureBookFor(actor: SessionUser, farmId: string): void {
  if (!canBookFor(actor, farmId)) throw new AppError(ErrorCode.forbidden, 403, 'Only the farm\'s members book its places');
}

/** Fees and costs: never to apprentices. */
export function seesMoney(actor: SessionUser, farmId?: string | null): boolean {
  return canSeeMoney(actor, farmId ?? actor.farmId ?? '');
}
