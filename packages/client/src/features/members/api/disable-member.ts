import type { MemberDisableInput, MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useMemberMutation } from './member-mutation';

/** Turns the account off at once: its sessions end and its live connections close. */
export function disableMember(userId: string, input: MemberDisableInput): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}/disable`, { method: 'POST', body: input });
}

export function useDisableMember(userId: string) {
  return useMemberMutation(userId, (input: MemberDisableInput) => disableMember(userId, input));
}
