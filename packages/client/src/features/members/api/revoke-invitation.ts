import type { MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useMemberMutation } from './member-mutation';

export function revokeInvitation(userId: string): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}/invitation`, { method: 'DELETE' });
}

export function useRevokeInvitation(userId: string) {
  return useMemberMutation(userId, () => revokeInvitation(userId));
}
