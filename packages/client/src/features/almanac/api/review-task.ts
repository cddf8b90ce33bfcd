import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlmanacTaskDto, EntryReviewInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { almanacKeys } from './almanac-keys';

export function reviewTask(taskId: string, input: EntryReviewInput): Promise<AlmanacTaskDto> {
  return apiFetch<AlmanacTaskDto>(`/api/almanac/tasks/${encodeURIComponent(taskId)}/review`, { method: 'POST', body: input });
}

/** The mentor accepts an apprentice's tick or returns it with a comment. */
export function useReviewTask() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ taskId, input }: { taskId: string; input: EntryReviewInput }) => reviewTask(taskId, input),
    onSettled: () => queryClient.invalidateQueries({ queryKey: almanacKeys.all }),
  });
}
