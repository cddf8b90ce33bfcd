import type { AuditEventDto } from '@burrowline/shared';
import type { AuditEvent } from './audit-event.model';

export function presentAuditEvent(event: AuditEvent, names: Map<string, string>): AuditEventDto {
  return {
    id: event.id,
    action: event.action,
    actor: event.actorUserId ? { id: event.actorUserId, name: names.get(event.actorUserId) ?? 'Unknown' } : null,
    subjectType: event.subjectType,
    subjectId: event.subjectId,
    details: event.details,
    ip: event.ip,
    createdAt: event.createdAt.toISOString(),
  };
}
