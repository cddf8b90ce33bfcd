import type { Transaction } from 'sequelize';
import { withTenant } from '../../db/tenant';
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
