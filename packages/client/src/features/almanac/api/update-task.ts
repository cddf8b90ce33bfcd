import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlmanacTaskDto, TaskUpdateInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from '../../litters';
import { almanacKeys } from './almanac-keys';

export function updateTask(taskId: string, input: TaskUpdateInput): Promise<AlmanacTaskDto> {
  return apiFetch<AlmanacTaskDto>(`/api/almanac/tasks/${encodeURIComponent(taskId)}`, { method: 'PATCH', body: input });
}

/** Done, moved, skipped or reopened: every view of the task refreshes (the agenda, Commons, its service or litter). */
export function useUpdateTask() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ taskId, input }: { taskId: string; input: TaskUpdateInput }) => updateTask(taskId, input),
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
      await queryClient.invalidateQueries({ queryKey: litterKeys.all });
    },
  });
}
