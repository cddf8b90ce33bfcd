import type { AuditCategory, AuditEventDto } from '@burrowline/shared';
import { roleLabels } from '../../lib/role-labels';

export const auditCategoryLabels: Record<AuditCategory, string> = {
  all: 'Everything',
  applications: 'Applications',
  members: 'Members',
  sign_in: 'Sign-ins and passwords',
  coop: 'Co-op rules',
};

const text = (value: unknown) => (typeof value === 'string' ? value : '');
const role = (value: unknown) => (value === 'admin' || value === 'member' || value === 'apprentice' ? roleLabels[value].toLowerCase() : text(value));

/** One line in plain words for each kind of event; unknown kinds show their code. */
export function describeAuditEvent(event: AuditEventDto): string {
  const d = event.details;
  switch (event.action) {
    case 'application.submitted':
      return `Application from ${text(d.applicantName)} (${text(d.farmName)})`;
    case 'application.approved':
      return `Approved ${text(d.applicantName)}; ${text(d.farmName)} joined the co-op`;
    case 'application.rejected':
      return `Did not admit ${text(d.applicantName)}: “${text(d.reason)}”`;
    case 'application.withdrawn':
      return `Marked the application of ${text(d.applicantName)} withdrawn${text(d.note) ? `: “${text(d.note)}”` : ''}`;
    case 'member.role_changed':
      return `Made ${text(d.name)} ${role(d.to) === 'admin' ? 'an admin' : `a ${role(d.to)}`} (was ${role(d.from)})`;
    case 'member.disabled':
      return `Turned off ${text(d.name)}'s account: “${text(d.reason)}”`;
    case 'member.enabled':
      return `Turned ${text(d.name)}'s account back on`;
    case 'member.link_sent':
      return `Sent ${text(d.name)} a new link to set a password`;
    case 'invitation.sent':
      return `Invited ${text(d.name)} (${text(d.email)}) as ${role(d.role)}, farm: ${text(d.farmName)}`;
    case 'invitation.revoked':
      return `Withdrew the invitation of ${text(d.name)}`;
    case 'invitation.accepted':
      return `${text(d.name)} accepted the invitation${d.farmCreated ? ' and their farm joined the co-op' : ''}`;
    case 'coop.rules_updated':
      return 'Edited the co-op rules';
    case 'sign_in.succeeded':
      return 'Signed in';
    case 'sign_in.failed':
      return 'Sign-in refused (wrong password or account off)';
    case 'sign_out':
      return 'Signed out';
    case 'password.set':
      return d.via === 'reset_password' ? 'Chose a new password from a reset link' : 'Set a password from a welcome link';
    case 'password_reset.requested':
      return 'Asked for a password reset link';
    default:
      return event.action;
  }
}

/** Where the event's subject can be looked at, if anywhere. */
export function subjectLink(event: AuditEventDto): string | null {
  if (!event.subjectId) return null;
  if (event.subjectType === 'Application') return `/admin/applications/${event.subjectId}`;
  if (event.subjectType === 'User') return `/admin/members/${event.subjectId}`;
  if (event.subjectType === 'Coop') return '/admin/rules';
  return null;
}
