import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationInput, MemberDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { auditKeys, memberKeys } from './member-keys';

export function inviteMember(input: InvitationInput): Promise<MemberDto> {
  return apiFetch<MemberDto>('/api/invitations', { method: 'POST', body: input });
}

export function useInviteMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteMember,
    onSuccess: (member) => {
      queryClient.setQueryData(memberKeys.detail(member.id), member);
      void queryClient.invalidateQueries({ queryKey: memberKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: auditKeys.all });
    },
  });
}
