import type { MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useMemberMutation } from './member-mutation';

/** A new link for someone who has not set a password yet; the older link stops working. */
export function sendSetPasswordLink(userId: string): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}/set-password-link`, { method: 'POST' });
}

export function useSendSetPasswordLink(userId: string) {
  return useMemberMutation(userId, () => sendSetPasswordLink(userId));
}
