import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AlmanacTaskDto, TaskBulkInput } from '@burrowline/shared';
import { apiFetch } from '../../../lib/api-client';
import { litterKeys } from '../../litters';
import { almanacKeys } from './almanac-keys';

/** Several tasks at once, all or none (the server refuses the lot if one was changed meanwhile). */
export function bulkUpdateTasks(input: TaskBulkInput): Promise<{ tasks: AlmanacTaskDto[] }> {
  return apiFetch<{ tasks: AlmanacTaskDto[] }>('/api/almanac/tasks/bulk', { method: 'POST', body: input });
}

export function useBulkUpdateTasks() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: bulkUpdateTasks,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: almanacKeys.all });
      await queryClient.invalidateQueries({ queryKey: litterKeys.all });
    },
  });
}
