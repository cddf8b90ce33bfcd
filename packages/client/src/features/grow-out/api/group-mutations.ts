import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EntryReviewInput, GroupWeighInCreateBody, GrowOutGroupCloseInput, GrowOutGroupCreateBody, GrowOutGroupDto } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { growOutKeys } from './grow-out-keys';

/** Every change to a group answers with the group as it is now. */
function useGroupMutation<V>(request: (variables: V) => Promise<GrowOutGroupDto>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: request,
    onSuccess: async (group) => {
      queryClient.setQueryData(growOutKeys.detail(group.id), group);
      await queryClient.invalidateQueries({ queryKey: growOutKeys.all });
    },
  });
}

export const formGroup = (body: GrowOutGroupCreateBody) => apiFetch<GrowOutGroupDto>('/api/grow-out/groups', { method: 'POST', body });
export const useFormGroup = () => useGroupMutation(formGroup);

export const weighGroup = ({ groupId, body }: { groupId: string; body: GroupWeighInCreateBody }) =>
  apiFetch<GrowOutGroupDto>(`/api/grow-out/groups/${groupId}/weigh-ins`, { method: 'POST', body });
export const useWeighGroup = () => useGroupMutation(weighGroup);

export const closeGroup = ({ groupId, body }: { groupId: string; body: GrowOutGroupCloseInput }) =>
  apiFetch<GrowOutGroupDto>(`/api/grow-out/groups/${groupId}/close`, { method: 'POST', body });
export const useCloseGroup = () => useGroupMutation(closeGroup);

/** The mentor accepts or returns an apprentice's group weigh-in (the Herd's review route). */
export function useReviewGroupWeighIn(groupId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ weighInId, body }: { weighInId: string; body: EntryReviewInput }) => apiFetch(`/api/weigh-ins/${weighInId}/review`, { method: 'POST', body }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: growOutKeys.detail(groupId) });
      await queryClient.invalidateQueries({ queryKey: growOutKeys.all });
    },
  });
}
