import { zodResolver } from '@hookform/resolvers/zod';
import { KeyRound, UserCheck, UserX } from 'lucide-react';
import type { ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { ErrorCode, memberDisableSchema, type MemberDisableInput, type Role, type MemberDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { isApiError } from '../../../lib/api-client';
import { formatInstantDate, formatInstant } from '../../../lib/dates';
import { roleLabels } from '../../../lib/role-labels';
import { useSession } from '../../../lib/session';
import { useChangeMemberRole } from '../api/change-member-role';
import { useDisableMember } from '../api/disable-member';
import { useEnableMember } from '../api/enable-member';
import { useAuditEvents } from '../api/get-audit-events';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { useSendSetPasswordLink } from '../api/send-set-password-link';
import { describeAuditEvent } from '../audit-labels';
import { roleDescriptions } from '../member-labels';
import { MemberStatusBadge } from './member-status-badge';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="space-y-1">
      <dt className="text-sm font-medium text-grey-600">{term}</dt>
      <dd className="break-words">{children}</dd>
    </div>
  );
}

function errorText(error: unknown): string {
  if (isApiError(error, ErrorCode.staleVersion)) return 'Another admin changed this person a moment ago. The page now shows their change; try again if it is still needed.';
  return error instanceof Error ? error.message : 'Try again.';
}

function RoleCard({ member }: { member: MemberDto }) {
  const change = useChangeMemberRole(member.id);
  // `values` keeps the picker on the saved role when the member changes (a save here, a live update).
  const form = useForm<{ role: string }>({ values: { role: member.role } });
  const chosen = form.watch('role');
  const options = [
    ...(member.role === 'apprentice' ? [{ value: 'apprentice', label: 'Apprentice (now)' }] : []),
    { value: 'member', label: 'Member' },
    { value: 'admin', label: 'Admin' },
  ];
  const submit = form.handleSubmit(({ role }) => {
    if (role === 'member' || role === 'admin') change.mutate({ role, version: member.version });
  });
  return (
    <Card className="space-y-4">
      <h2 className="text-xl font-bold">Role</h2>
      <form onSubmit={submit} className="space-y-4">
        {change.isError && <Alert tone="error" title="Role not changed">{errorText(change.error)}</Alert>}
        {change.isSuccess && <Alert tone="success">Role saved. {member.name} was signed out everywhere and signs in again as {roleLabels[member.role].toLowerCase()}.</Alert>}
        <SelectField
          label="Role in the co-op"
          hint={roleDescriptions[chosen as Role] ?? roleDescriptions[member.role]}
          options={options}
          {...form.register('role')}
        />
        <p className="text-sm text-grey-600">Changing the role signs {member.name} out on every device, so their next sign-in carries the new role.</p>
        <Button type="submit" isBusy={change.isPending} disabled={chosen === member.role}>
          Change role
        </Button>
      </form>
    </Card>
  );
}

function AccountCard({ member }: { member: MemberDto }) {
  const disable = useDisableMember(member.id);
  const enable = useEnableMember(member.id);
  const form = useForm<MemberDisableInput>({ resolver: zodResolver(memberDisableSchema), defaultValues: { reason: '', version: member.version } });
  const submit = form.handleSubmit(({ reason }) => disable.mutate({ reason, version: member.version }));

  if (member.status === 'disabled') {
    return (
      <Card className="space-y-4">
        <h2 className="text-xl font-bold">Account</h2>
        {enable.isError && <Alert tone="error" title="Not turned on">{errorText(enable.error)}</Alert>}
        <Alert tone="warning" title={`Turned off${member.disabledAt ? ` on ${formatInstant(member.disabledAt)}` : ''}`}>
          {member.disabledReason}
        </Alert>
        <Button onClick={() => enable.mutate({ version: member.version })} isBusy={enable.isPending}>
          <UserCheck className="size-4" aria-hidden="true" />
          Turn account back on
        </Button>
      </Card>
    );
  }
  return (
    <Card className="space-y-4">
      <h2 className="text-xl font-bold">Turn off this account</h2>
      <p>
        {member.name} is signed out at once, everywhere, and cannot sign in until an admin turns the account back on. Their
        farm and records stay as they are.
      </p>
      <form onSubmit={submit} noValidate className="space-y-4">
        {disable.isError && <Alert tone="error" title="Not turned off">{errorText(disable.error)}</Alert>}
        <TextAreaField
          label="Reason"
          hint="Kept in the audit log for the co-op's admins; not e-mailed."
          rows={3}
          error={form.formState.errors.reason?.message}
          {...form.register('reason')}
        />
        <Button type="submit" variant="danger" isBusy={disable.isPending}>
          <UserX className="size-4" aria-hidden="true" />
          Turn off account
        </Button>
      </form>
    </Card>
  );
}

function LinkCard({ member }: { member: MemberDto }) {
  const send = useSendSetPasswordLink(member.id);
  const revoke = useRevokeInvitation(member.id);
  return (
    <Card className="space-y-4">
      <h2 className="text-xl font-bold">{member.status === 'invited' ? 'Invitation' : 'Password not set yet'}</h2>
      {member.invitation ? (
        <p>
          Invited by {member.invitation.invitedBy?.name ?? 'an admin'} on {formatInstant(member.invitation.invitedAt)}. On
          accepting, they {member.farm ? 'join' : 'get'} <strong>{member.invitation.farmName}</strong>.
        </p>
      ) : (
        <p>{member.name} was admitted but has not set a password yet.</p>
      )}
      {send.isSuccess && <Alert tone="success">A new link is on its way to {member.email}. Any older link no longer works.</Alert>}
      {(send.isError || revoke.isError) && <Alert tone="error" title="Not done">{errorText(send.error ?? revoke.error)}</Alert>}
      <div className="flex flex-col gap-3 sm:flex-row">
        <Button onClick={() => send.mutate(undefined)} isBusy={send.isPending}>
          <KeyRound className="size-4" aria-hidden="true" />
          Send a new link
        </Button>
        {member.status === 'invited' && (
          <Button variant="secondary" onClick={() => revoke.mutate(undefined)} isBusy={revoke.isPending}>
            Withdraw invitation
          </Button>
        )}
      </div>
    </Card>
  );
}

function History({ member }: { member: MemberDto }) {
  const { data } = useAuditEvents({ category: 'all', subjectId: member.id, dir: 'desc', page: 1, pageSize: 10 });
  return (
    <Card className="space-y-3">
      <h2 className="text-xl font-bold">History</h2>
      {!data ? (
        <p className="text-grey-600">Loading…</p>
      ) : data.items.length === 0 ? (
        <p className="text-grey-600">No admin changes yet.</p>
      ) : (
        <ol className="space-y-2">
          {data.items.map((event) => (
            <li key={event.id} className="border-l-4 border-moss-wash pl-3">
              <p>{describeAuditEvent(event)}</p>
              <p className="text-sm text-grey-600">
                {event.actor?.name ?? 'Someone'} · {formatInstant(event.createdAt)}
              </p>
            </li>
          ))}
        </ol>
      )}
      <Link to={`/admin/audit?subjectId=${member.id}`} className="inline-flex min-h-11 items-center font-medium text-moss-deep underline underline-offset-4">
        All of it in the audit log
      </Link>
    </Card>
  );
}

/** One person of the co-op as the admin manages them: role, account, set-password link, history. */
export function MemberDetail({ member }: { member: MemberDto }) {
  const me = useSession();
  const isSelf = me.user.id === member.id;
  const withoutPassword = member.status === 'invited' || member.status === 'awaiting_password';
  return (
    <div className="space-y-6">
      <PageHeader title={member.name} lead={member.email} actions={<MemberStatusBadge status={member.status} />} />
      <Card>
        <dl className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          <Fact term="Role">{roleLabels[member.role]}</Fact>
          <Fact term="Farm">
            {member.farm ? (
              <Link to={`/farms/${member.farm.id}`} className="font-medium text-moss-deep underline underline-offset-4">
                {member.farm.name}
              </Link>
            ) : (
              <span className="text-grey-600">None yet</span>
            )}
          </Fact>
          {member.mentor && <Fact term="Mentor">{member.mentor.name}</Fact>}
          <Fact term="In the co-op since">{formatInstantDate(member.joinedAt)}</Fact>
          <Fact term="Last sign-in">{member.lastSignInAt ? formatInstant(member.lastSignInAt) : 'Never'}</Fact>
        </dl>
      </Card>
      {isSelf ? (
        <Alert tone="info" title="This is you">
          Another admin of the co-op can change your role or turn off your account; you cannot do it to yourself.
        </Alert>
      ) : (
        <div className="grid gap-6 lg:grid-cols-2">
          {withoutPassword && member.status !== 'disabled' && <LinkCard member={member} />}
          <RoleCard member={member} />
          <AccountCard member={member} />
        </div>
      )}
      <History member={member} />
    </div>
  );
}
