import type { MemberDto, MemberEnableInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { useMemberMutation } from './member-mutation';

export function enableMember(userId: string, input: MemberEnableInput): Promise<MemberDto> {
  return apiFetch<MemberDto>(`/api/members/${encodeURIComponent(userId)}/enable`, { method: 'POST', body: input });
}

export function useEnableMember(userId: string) {
  return useMemberMutation(userId, (input: MemberEnableInput) => enableMember(userId, input));
}
