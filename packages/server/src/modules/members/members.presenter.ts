import type { MemberDto, MemberStatus } from '@burrowline/shared';
import type { UserRecord } from '../users/users.service';
import type { Invitation } from './invitation.model';

export interface MemberFacts {
  invitation: Invitation | null;
  names: Map<string, string>;
  farmNames: Map<string, string>;
  lastSignInAt: Date | null;
}

function statusOf(user: UserRecord, invitation: Invitation | null): MemberStatus {
  if (user.disabledAt) return 'disabled';
  if (!user.passwordHash) return invitation ? 'invited' : 'awaiting_password';
  return 'active';
}

/** The admin's view of one person; never the password hash, only whether one is set. */
export function presentMember(user: UserRecord, facts: MemberFacts): MemberDto {
  const { invitation, names, farmNames } = facts;
  const ref = (id: string | null | undefined, name: string | undefined) => (id ? { id, name: name ?? 'Unknown' } : null);
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    status: statusOf(user, invitation),
    farm: ref(user.farmId, user.farmId ? farmNames.get(user.farmId) : undefined),
    mentor: ref(user.mentorId, user.mentorId ? names.get(user.mentorId) : undefined),
    disabledAt: user.disabledAt?.toISOString() ?? null,
    disabledReason: user.disabledReason,
    invitation: invitation
      ? {
          id: invitation.id,
          invitedAt: invitation.createdAt.toISOString(),
          invitedBy: ref(invitation.invitedByUserId, names.get(invitation.invitedByUserId)),
          farmName: invitation.newFarmName ?? (invitation.farmId ? (farmNames.get(invitation.farmId) ?? '') : ''),
        }
      : null,
    joinedAt: user.createdAt.toISOString(),
    lastSignInAt: facts.lastSignInAt?.toISOString() ?? null,
    version: user.version,
  };
}
