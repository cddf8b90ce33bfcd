import { randomBytes } from 'node:crypto';
import ical, { ICalCalendarMethod } from 'ical-generator';
import { Op, type Transaction } from 'sequelize';
import { countOf, addDays, defineAbilityFor, ErrorCode, subjectOf, TASK_KIND_LABELS, type AbilityUser, type CalendarFeedDto } from '@burrowline/shared';
import { lockUntilCommit } from '../../db/advisory-lock';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordAudit } from '../audit/audit.service';
import { hashToken } from '../one-time-tokens/one-time-tokens.service';
import { findUser } from '../users/users.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { farmClockOf } from '../farms/farm-clock';
import { animalLabel } from './almanac.presenter';
import { CalendarFeedToken } from './calendar-feed-token.model';
import { AlmanacTask } from './task.model';
import { sharedDaysOfFarm } from './shared-days';
import { presentContextOf } from './tasks.service';

/** How far back and ahead the feed reaches (a phone calendar keeps what it has already seen). */
const FEED_DAYS_BACK = 60;
const FEED_DAYS_AHEAD = 400;

function feedUrl(appUrl: string, token: string): string {
  return `${appUrl}/api/calendar-feeds/${token}.ics`;
}

/** Whether the actor's farm has a live feed (its address is shown only once, when it is made). */
export async function calendarFeedStatus(actor: SessionUser): Promise<CalendarFeedDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'CalendarFeed', { farmId }, 'That calendar feed', 'Only members of the farm manage its calendar feed');
  return withTenant(actor, async (tx) => {
    const live = await CalendarFeedToken.findOne({ where: { farmId, revokedAt: { [Op.is]: null } }, transaction: tx });
    return { active: Boolean(live), createdAt: live?.createdAt.toISOString() ?? null, url: null };
  });
}

/**
 * Makes the farm's secret feed address, or renews it: the old address stops working at once. Only the
 * token's SHA-256 is kept; the address is in this answer and nowhere else.
 */
export async function renewCalendarFeed(actor: SessionUser, appUrl: string): Promise<CalendarFeedDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'create', 'CalendarFeed', { farmId }, 'That calendar feed', 'Only members of the farm manage its calendar feed');
  return withTenant(actor, async (tx) => {
    // One renewal at a time per farm: each revokes the one before, so the farm keeps exactly one live feed.
    await lockUntilCommit(tx, `calendar-feed:${farmId}`);
    const renewed = await CalendarFeedToken.update({ revokedAt: new Date() }, { where: { farmId, revokedAt: { [Op.is]: null } }, transaction: tx });
    const token = randomBytes(32).toString('base64url');
    const row = await CalendarFeedToken.create({ coopId: actor.coopId, farmId, createdBy: actor.id, tokenHash: hashToken(token) }, { transaction: tx });
    await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: renewed[0] > 0 ? 'calendar_feed.renewed' : 'calendar_feed.created', subjectType: 'farm', subjectId: farmId }, tx);
    return { active: true, createdAt: row.createdAt.toISOString(), url: feedUrl(appUrl, token) };
  });
}

/** Turns the feed off: its address stops working. */
export async function revokeCalendarFeed(actor: SessionUser): Promise<void> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'delete', 'CalendarFeed', { farmId }, 'That calendar feed', 'Only members of the farm manage its calendar feed');
  await withTenant(actor, async (tx) => {
    await lockUntilCommit(tx, `calendar-feed:${farmId}`);
    await CalendarFeedToken.update({ revokedAt: new Date() }, { where: { farmId, revokedAt: { [Op.is]: null } }, transaction: tx });
    await recordAudit({ coopId: actor.coopId, actorUserId: actor.id, action: 'calendar_feed.revoked', subjectType: 'farm', subjectId: farmId }, tx);
  });
}

/** A person as a feed's maker: the facts that decide whether their feeds may still answer. */
export type FeedMaker = AbilityUser & { disabledAt: Date | null };

/** Whether the person, as they are now, may still have a feed of the farm's Almanac. */
function mayKeepFeed(maker: FeedMaker, farmId: string): boolean {
  if (maker.disabledAt) return false;
  return defineAbilityFor(maker).can('read', subjectOf('CalendarFeed', { coopId: maker.coopId, farmId }));
}

/**
 * Revokes every live feed the person made on a farm whose Almanac they may no longer have: turned off,
 * gone from the farm, or a role without the calendar feed. Call it in the transaction of that change,
 * so the feed never answers after the change is committed.
 */
export async function revokeFeedsNoLongerAllowed(maker: FeedMaker, tx: Transaction, actorUserId: string): Promise<number> {
  const live = await CalendarFeedToken.findAll({ where: { createdBy: maker.id, revokedAt: { [Op.is]: null } }, transaction: tx, lock: tx.LOCK.UPDATE });
  const outgrown = live.filter((feed) => !mayKeepFeed(maker, feed.farmId));
  if (outgrown.length === 0) return 0;
  await CalendarFeedToken.update({ revokedAt: new Date() }, { where: { id: { [Op.in]: outgrown.map((feed) => feed.id) } }, transaction: tx });
  for (const feed of outgrown) {
    await recordAudit(
      { coopId: maker.coopId, actorUserId, action: 'calendar_feed.revoked', subjectType: 'farm', subjectId: feed.farmId, details: { reason: 'maker_lost_access', makerUserId: maker.id } },
      tx,
    );
  }
  return outgrown.length;
}

/**
 * The farm's Almanac as an iCalendar (RFC 5545) feed, for the token in its secret address; null for an
 * unknown or revoked token. Each task is an all-day event whose UID is the task's id, so a calendar
 * updates it in place when it is moved, done or re-planned (SEQUENCE follows the task's version).
 */
export async function calendarFeedFor(token: string, opts: { appUrl: string; now?: Date }): Promise<string | null> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  // Before the tenant is known: the token table is outside row-level security, looked up by hash only.
  const row = await CalendarFeedToken.findOne({ where: { tokenHash: hashToken(token), revokedAt: { [Op.is]: null } } });
  if (!row) return null;
  const now = opts.now ?? new Date();
  return withTenant({ coopId: row.coopId }, async (tx) => {
    // A change that forgot to revoke the maker's feeds still cannot keep one answering.
    const maker = await findUser(row.createdBy, tx);
    if (!maker || !mayKeepFeed(maker, row.farmId)) {
      await CalendarFeedToken.update({ revokedAt: now }, { where: { id: row.id }, transaction: tx });
      return null;
    }
    await CalendarFeedToken.update({ lastUsedAt: now }, { where: { id: row.id }, transaction: tx });
    const clock = await farmClockOf(tx, row.coopId, row.farmId, now);
    const tasks = await AlmanacTask.findAll({
      where: {
        farmId: row.farmId,
        state: { [Op.in]: ['open', 'moved', 'done'] },
        dueOn: { [Op.between]: [addDays(clock.today, -FEED_DAYS_BACK), addDays(clock.today, FEED_DAYS_AHEAD)] },
      },
      order: [['dueOn', 'ASC'], ['id', 'ASC']],
      transaction: tx,
    });
    const ctx = await presentContextOf(tx, row.coopId, clock.today, { animalIds: tasks.map((t) => t.animalId) });
    const calendar = ical({
      name: `Almanac · ${clock.name}`,
      description: `Burrowline Almanac of ${clock.name}: services, palpations, nest boxes, kindlings, weanings and quarantines.`,
      prodId: { company: 'Burrowline', product: 'Almanac', language: 'EN' },
      method: ICalCalendarMethod.PUBLISH,
      timezone: clock.timeZone,
      ttl: 60 * 60,
    });
    for (const task of tasks) {
      const subject = task.animalId ? animalLabel(ctx.animals.get(task.animalId)) : '';
      const title = TASK_KIND_LABELS[task.kind];
      const lines = [
        task.windowStart && task.kind === 'kindling_due' ? `Kindling window ${task.windowStart} to ${task.windowEnd}.` : null,
        task.kind === 'quarantine_end' && task.windowStart ? `In quarantine from ${task.windowStart}; isolated from the herd until this day.` : null,
        task.ageDays ? `Litter age ${countOf(task.ageDays, 'day')}.` : null,
        `Planned from the ${task.anchor === 'palpation' ? 'empty palpation' : task.anchor} of ${task.anchorDate}.`,
        task.state === 'moved' ? `Moved from ${task.movedFrom}.` : null,
        task.state === 'done' ? `Done on ${task.doneOn}.` : null,
      ].filter(Boolean);
      const link = task.litterId ? `/litters/${task.litterId}` : task.serviceId ? `/almanac/services/${task.serviceId}` : '/almanac';
      calendar.createEvent({
        id: task.id,
        sequence: task.version,
        start: task.dueOn,
        end: addDays(task.dueOn, 1),
        allDay: true,
        stamp: now,
        lastModified: task.updatedAt,
        summary: `${task.state === 'done' ? '✓ ' : ''}${title}${subject ? `: ${subject}` : ''}`,
        description: lines.join('\n'),
        url: `${opts.appUrl}${link}`,
      });
    }
    const from = addDays(clock.today, -FEED_DAYS_BACK);
    for (const day of await sharedDaysOfFarm(tx, row.coopId, row.farmId, from, addDays(clock.today, FEED_DAYS_AHEAD))) {
      calendar.createEvent({
        id: `shared-day-${day.id}`, sequence: day.version, start: day.date, end: addDays(day.date, 1), allDay: true, stamp: now,
        summary: day.title, description: day.description, url: `${opts.appUrl}${day.link}`,
      });
    }
    return calendar.toString();
  });
}

/** The feed's address errors carry no detail: a wrong or revoked token is simply not there. */
export function feedNotFound(): AppError {
  return new AppError(ErrorCode.notFound, 404, 'No such calendar feed; renew the address in the Almanac settings');
}
