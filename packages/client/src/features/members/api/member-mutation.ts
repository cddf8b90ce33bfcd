import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MemberDto } from '@burrowline/shared';
import { auditKeys, memberKeys } from './member-keys';

/** Every change to a member answers with the member as it is now: put it in the cache, refresh the lists. */
export function useMemberMutation<V>(userId: string, request: (variables: V) => Promise<MemberDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSuccess: (member) => {
      queryClient.setQueryData(memberKeys.detail(userId), member);
      void queryClient.invalidateQueries({ queryKey: memberKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: auditKeys.all });
      void queryClient.invalidateQueries({ queryKey: ['farms'] });
    },
    // A stale version or a conflict: show what is true now.
    onError: () => void queryClient.invalidateQueries({ queryKey: memberKeys.detail(userId) }),
  });
}
