import { ForbiddenError } from '@casl/ability';
import { col, fn, Op, type Transaction, type WhereOptions } from 'sequelize';
import { defineAbilityFor, subjectOf, type AuditCategory, type AuditEventListDto, type AuditEventQuery } from '@burrowline/shared';
import { insertMany } from '../../db/bulk-insert';
import { accessibleWhere } from '../../db/scope';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { namesOf } from '../users/users.service';
import { presentAuditEvent } from './audit.presenter';
import { AuditEvent } from './audit-event.model';
import { RecordChange } from './record-change.model';

export interface AuditInput {
  coopId: string | null;
  actorUserId: string | null;
  action: string;
  subjectType?: string;
  subjectId?: string;
  details?: Record<string, unknown>;
  ip?: string | null;
}

/**
 * Appends a security event (sign-in, sign-out, password change, role change…). Pass `tx` when
 * inside a tenant transaction so the event commits or rolls back with the change it records.
 */
export async function recordAudit(event: AuditInput, tx?: Transaction): Promise<void> {
  const row = { ...event, details: event.details ?? {}, ip: event.ip ?? null };
  if (tx) {
    await AuditEvent.create(row, { transaction: tx, returning: false });
  } else if (event.coopId) {
    await withTenant({ coopId: event.coopId }, (t) => AuditEvent.create(row, { transaction: t, returning: false }));
  } else {
    // No tenant yet (an unknown e-mail at sign-in): RLS lets only co-op-less rows through here.
    await AuditEvent.create(row, { returning: false });
  }
}

/** Keeps who changed which fields of a record others refer to (old → new). */
export async function recordChanges(
  entry: { coopId: string; tableName: string; recordId: string; actorUserId: string | null; changes: Record<string, [unknown, unknown]> },
  tx: Transaction,
): Promise<void> {
  await RecordChange.create(entry, { transaction: tx, returning: false });
}

/** The same for many records at once (a spreadsheet import), in one statement. */
export async function recordChangesMany(
  entries: { coopId: string; tableName: string; recordId: string; actorUserId: string | null; changes: Record<string, [unknown, unknown]> }[],
  tx: Transaction,
): Promise<void> {
  await insertMany(tx, 'record_changes', { coopId: 'uuid', tableName: 'text', recordId: 'uuid', actorUserId: 'uuid', changes: 'jsonb' }, entries);
}

/** When each person of the co-op last signed in, from the audit log. */
export async function lastSignIns(coopId: string, tx: Transaction, userIds?: string[]): Promise<Map<string, Date>> {
  const rows = (await AuditEvent.findAll({
    where: { coopId, action: 'sign_in.succeeded', ...(userIds ? { actorUserId: { [Op.in]: userIds } } : {}) },
    attributes: ['actorUserId', [fn('max', col('created_at')), 'at']],
    group: ['actorUserId'],
    raw: true,
    transaction: tx,
  })) as unknown as { actorUserId: string; at: Date | string }[];
  return new Map(rows.map((r) => [r.actorUserId, new Date(r.at)]));
}

/** Which actions each filter of the audit log covers. */
const categoryPatterns: Record<Exclude<AuditCategory, 'all'>, string[]> = {
  applications: ['application.%'],
  members: ['member.%', 'invitation.%'],
  sign_in: ['sign_in.%', 'sign_out', 'password.%', 'password_reset.%'],
  coop: ['coop.%'],
};

/** The co-op's audit log for its admins, newest first, filtered and paged. */
export async function listAuditEvents(actor: SessionUser, query: AuditEventQuery): Promise<AuditEventListDto> {
  const ability = defineAbilityFor(actor);
  ForbiddenError.from(ability).throwUnlessCan('read', subjectOf('AuditEvent', { coopId: actor.coopId }));
  return withTenant(actor, async (tx) => {
    const conditions: WhereOptions[] = [accessibleWhere(ability, 'read', 'AuditEvent')];
    if (query.category !== 'all') {
      conditions.push({ [Op.or]: categoryPatterns[query.category].map((pattern) => ({ action: { [Op.like]: pattern } })) });
    }
    if (query.actorId) conditions.push({ actorUserId: query.actorId });
    if (query.subjectId) conditions.push({ subjectId: query.subjectId });
    const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
    const { rows, count } = await AuditEvent.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [['createdAt', dir], ['id', dir]],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
      transaction: tx,
    });
    const names = await namesOf(rows.map((r) => r.actorUserId), tx);
    return { items: rows.map((row) => presentAuditEvent(row, names)), total: count, page: query.page, pageSize: query.pageSize };
  });
}
